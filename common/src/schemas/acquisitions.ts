import { z } from 'zod';
import { inputShape } from '../fields/field';
import { ACQUISITION_FIELDS, ENTRY_FIELDS } from '../fields/procedures';
import { id, isoDate } from './primitives';
import { ACQUISITION_METHOD, ENTRY_REASON } from './procedure-vocab';

export const entryInputSchema = z.object(inputShape(ENTRY_FIELDS));
export type EntryInput = z.infer<typeof entryInputSchema>;
export const entryUpdateSchema = entryInputSchema.partial().extend({ version: z.number().int().min(1) });

const printLink = z.object({ id, accessionNumber: z.string(), title: z.string(), status: z.string() });

export const acquisitionInputSchema = z.object({
  ...inputShape(ACQUISITION_FIELDS),
  /** The object entry the acquisition follows from, if any. */
  entryId: z.preprocess((v) => (v === '' ? null : v), id.nullable()).optional(),
});
export type AcquisitionInput = z.infer<typeof acquisitionInputSchema>;
export const acquisitionUpdateSchema = acquisitionInputSchema.partial().extend({ version: z.number().int().min(1) });

/** Accessioning: links catalogued prints to the acquisition (added), or takes links off (removed). */
export const acquisitionPrintsInputSchema = z.object({
  add: z.array(id).max(1000).default([]),
  remove: z.array(id).max(1000).default([]),
  version: z.number().int().min(1),
});

export const acquisitionSchema = z.object({
  id, entryId: id.nullable(), entryNumber: z.string().nullable(),
  source: z.string(), method: z.enum(ACQUISITION_METHOD.codes), approvedOn: isoDate.nullable(), acquiredOn: isoDate,
  titleDocument: z.string().nullable(), funds: z.string().nullable(), notes: z.string().nullable(),
  prints: z.array(printLink),
  createdBy: z.string(), version: z.number().int(), createdAt: z.string().datetime(), updatedAt: z.string().datetime(),
});
export type Acquisition = z.infer<typeof acquisitionSchema>;

export const entrySchema = z.object({
  id, entryNumber: z.string(),
  enteredOn: isoDate, depositor: z.string(), depositorContact: z.string().nullable(), reason: z.enum(ENTRY_REASON.codes),
  objectCount: z.number().int(), objectsDescription: z.string(), returnBy: isoDate.nullable(), notes: z.string().nullable(),
  receivedBy: z.string(),
  acquisitions: z.array(z.object({ id, acquiredOn: isoDate, method: z.enum(ACQUISITION_METHOD.codes), prints: z.number().int() })),
  version: z.number().int(), createdAt: z.string().datetime(), updatedAt: z.string().datetime(),
});
export type ObjectEntry = z.infer<typeof entrySchema>;

export const entryListQuerySchema = z.object({ q: z.string().trim().max(200).optional() });
