import { z } from 'zod';
import { id, isoDateTime } from './primitives';
import { printListQuerySchema } from './catalogue';

/**
 * Preservation packages: the collection (or a selection of it) out as a BagIt bag (RFC 8493), and a
 * bag brought back into an empty installation. The bag's own files are described by the data
 * dictionary it carries (`data/dictionary/`).
 */

/** Ids a registrar may send as a selection; a larger selection is a catalogue search. */
export const BAG_SELECTION_IDS_MAX = 5000;

/** The catalogue list's filters without page and order: the search a selection export bags. */
export const bagSearchSchema = printListQuerySchema.omit({ page: true, pageSize: true, sort: true });
export type BagSearch = z.infer<typeof bagSearchSchema>;

export const bagSelectionSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('ids'),
    ids: z.array(id).min(1, 'Choose at least one print').max(BAG_SELECTION_IDS_MAX, `At most ${BAG_SELECTION_IDS_MAX} prints; export a search for more`),
  }),
  z.object({ kind: z.literal('query'), query: bagSearchSchema }),
]);
export type BagSelection = z.infer<typeof bagSelectionSchema>;

/** What an export bags: the whole collection (administrators) or a selection (registrars too). */
export const bagExportStartSchema = z.discriminatedUnion('scope', [
  z.object({ scope: z.literal('collection'), withImages: z.boolean().default(true) }),
  z.object({ scope: z.literal('selection'), selection: bagSelectionSchema, withImages: z.boolean().default(true) }),
]);
export type BagExportStart = z.infer<typeof bagExportStartSchema>;

export const BAG_JOB_STATUS = ['queued', 'running', 'done', 'failed'] as const;

/** A problem a bag check found: the file it concerns (when one) and what is wrong. */
export const bagProblemSchema = z.object({ path: z.string().nullable(), message: z.string() });
export type BagProblem = z.infer<typeof bagProblemSchema>;

/** An export or an import of a bag, with its progress. */
export const bagJobSchema = z.object({
  id,
  kind: z.enum(['export', 'import']),
  scope: z.enum(['collection', 'selection']),
  selection: bagSelectionSchema.nullable(),
  withImages: z.boolean(),
  status: z.enum(BAG_JOB_STATUS),
  /** What the job is doing now, in words (e.g. "Prints", "Images", "Checking the manifest"). */
  stage: z.string().nullable(),
  done: z.number().int(),
  total: z.number().int(),
  sizeBytes: z.number().int().nullable(),
  payloadOxum: z.string().nullable(),
  fileCount: z.number().int().nullable(),
  problems: z.array(bagProblemSchema),
  error: z.string().nullable(),
  createdByName: z.string().nullable(),
  createdAt: isoDateTime,
  startedAt: isoDateTime.nullable(),
  finishedAt: isoDateTime.nullable(),
  /** Whether the bag can be downloaded (an export that finished). */
  downloadable: z.boolean(),
});
export type BagJob = z.infer<typeof bagJobSchema>;

/** The first lines of each print's file in the bag (`data/prints/<accession>.json`): its sections follow. */
export const bagPrintFileSchema = z.object({
  format: z.literal('toneledger-print/1'),
  accessionNumber: z.string(),
  /** The print's stored record: columns by their stored names (snake_case). */
  print: z.record(z.string(), z.unknown()),
  /** One array per section (process steps, condition reports, …), each row a stored record with its own rows nested. */
  sections: z.record(z.string(), z.array(z.record(z.string(), z.unknown()))),
});
export type BagPrintFile = z.infer<typeof bagPrintFileSchema>;
