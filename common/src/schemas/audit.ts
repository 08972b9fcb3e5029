import { z } from 'zod';
import { pageQuerySchema } from './envelope';
import { isoDate } from './primitives';
import { RECORD_PAGE_KINDS } from '../fields/audit-records';

/**
 * The record an event is about, as a person reads it: its kind in words ("Condition report"), its
 * name where it has one (a print's accession number, a person's name, a loan's reference…) and the
 * page it opens on, if the app has one and the record still exists. `entityType`/`entityId` stay
 * on the event for filtering and the export; they are not the visible text.
 */
export const auditRecordSchema = z.object({
  kind: z.string(),
  name: z.string().nullable(),
  link: z.object({ page: z.enum(RECORD_PAGE_KINDS), id: z.string() }).nullable(),
});
export type AuditRecord = z.infer<typeof auditRecordSchema>;

export const auditEventSchema = z.object({
  id: z.string(),
  at: z.string().datetime(),
  actorId: z.string().uuid().nullable(),
  actorName: z.string().nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string().nullable(),
  before: z.unknown().nullable(),
  after: z.unknown().nullable(),
  requestId: z.string().nullable(),
  /** The action as a sentence: "Maren Oakshott replaced the process history of print 1987.14.3." */
  sentence: z.string(),
  /** The action's short label ("Process history replaced"). */
  actionLabel: z.string(),
  /** Each changed field: its label and its values before and after as people read them (fields/audit-words.ts). */
  changes: z.array(z.object({ field: z.string(), label: z.string(), before: z.string(), after: z.string() })),
  record: auditRecordSchema,
});
export type AuditEvent = z.infer<typeof auditEventSchema>;

export const auditListQuerySchema = pageQuerySchema.extend({
  action: z.string().trim().max(100).optional(),
  entityType: z.string().trim().max(100).optional(),
  entityId: z.string().trim().max(100).optional(),
  actorId: z.string().uuid().optional(),
  /** Events on or after this day (UTC). */
  from: isoDate.optional(),
  /** Events on or before this day (UTC). */
  to: isoDate.optional(),
});
export type AuditListQuery = z.infer<typeof auditListQuerySchema>;

/** The filters of the audit trail without paging: what the CSV export reads. */
export const auditExportQuerySchema = auditListQuerySchema.omit({ page: true, pageSize: true });
export type AuditExportQuery = z.infer<typeof auditExportQuerySchema>;

/** What the audit screen's pickers offer: the people who appear in the trail, the actions recorded and the kinds of record. */
export const auditChoicesSchema = z.object({
  people: z.array(z.object({ id: z.string().uuid(), name: z.string() })),
  actions: z.array(z.object({ code: z.string(), label: z.string() })),
  recordKinds: z.array(z.object({ code: z.string(), label: z.string() })),
});
