import { z } from 'zod';
import { id, isoDateTime } from './primitives';
import { printListQuerySchema, statusSchema } from './catalogue';

/**
 * Actions on many prints at once (the catalogue list's selection). A selection is either the prints
 * a person ticked (ids, at most BULK_IDS_MAX) or "every print matching this search": the list's own
 * filters, resolved on the server when the preview and the apply run, never an id list in the browser.
 */

/** Ids a browser may send as a selection (ticked rows, across pages). */
export const BULK_IDS_MAX = 1000;
/** Prints one apply may change, in one transaction; a larger selection is refused with the count. */
export const BULK_APPLY_MAX = 5000;
/** Rows a preview lists one by one (its counts and warnings cover the whole selection). */
export const BULK_PREVIEW_ROWS = 200;

/** The list's filters without page and order: what "select all N matching" sends. */
export const printSelectionQuerySchema = printListQuerySchema.omit({ page: true, pageSize: true, sort: true });
export type PrintSelectionQuery = z.infer<typeof printSelectionQuerySchema>;

export const printSelectionSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('ids'),
    ids: z.array(id).min(1, 'Choose at least one print').max(BULK_IDS_MAX, `At most ${BULK_IDS_MAX} ticked prints; use "select all matching" for more`),
  }),
  z.object({ kind: z.literal('query'), query: printSelectionQuerySchema }),
]);
export type PrintSelection = z.infer<typeof printSelectionSchema>;

const reasonText = z.string().trim().min(1, 'Say why the prints move').max(500, 'At most 500 characters');

/** What each action changes: one schema per action, shared by its preview and its apply. */
export const bulkMoveSchema = z.object({ toLocationId: id, reason: reasonText, movedAt: isoDateTime.optional() });
export const bulkRehouseSchema = z.object({
  enclosureId: id,
  reason: z.preprocess((v) => (v === '' ? null : v), z.string().trim().max(500, 'At most 500 characters').nullable()).optional(),
});
export const bulkStatusSchema = z.object({
  status: statusSchema.refine((s) => s !== 'on_loan' && s !== 'deaccessioned', {
    message: 'On loan is set by a loan, and a deaccession is its own record; choose another status',
  }),
});
export const bulkRoundSchema = z.object({ roundId: id });
export const bulkExhibitionSchema = z.object({ exhibitionId: id });

export const BULK_ACTIONS = ['move', 'rehouse', 'status', 'round', 'exhibition'] as const;
export type BulkAction = (typeof BULK_ACTIONS)[number];

/** The preview is asked with the selection and the action's fields. */
export const previewBody = <S extends z.ZodRawShape>(shape: S) => z.object({ ...shape, selection: printSelectionSchema });
/**
 * The apply repeats them with the preview's fingerprint: if any selected print changed since (a
 * version, a print added to or gone from the search), the apply is refused with 409 and a fresh
 * preview, so what is applied is exactly what was previewed.
 */
export const applyBody = <S extends z.ZodRawShape>(shape: S) =>
  z.object({ ...shape, selection: printSelectionSchema, fingerprint: z.string().regex(/^[0-9a-f]{64}$/, 'Preview the action again') });

export const bulkOutcomeSchema = z.enum(['change', 'unchanged', 'refused']);
export const bulkPreviewRowSchema = z.object({
  printId: id, accessionNumber: z.string(), title: z.string(),
  outcome: bulkOutcomeSchema,
  /** The value now and after, in words (a place's path, an enclosure's name, a status). */
  before: z.string().nullable(), after: z.string().nullable(),
  /** Why it is unchanged or refused. */
  note: z.string().nullable(),
  /** Warning codes the change would add to the print. */
  newWarnings: z.array(z.string()),
});
export type BulkPreviewRow = z.infer<typeof bulkPreviewRowSchema>;

export const bulkWarningSchema = z.object({
  code: z.string(),
  severity: z.enum(['high', 'medium', 'low']),
  /** One sentence with the count, e.g. "12 iron-blue prints would move into buffered enclosures". */
  message: z.string(),
  count: z.number().int(),
  /** The prints it concerns (for the rehouse offer), at most BULK_IDS_MAX. */
  printIds: z.array(id),
  /** 'rehouse': the screen offers the rehouse action with these prints selected. */
  offer: z.enum(['rehouse']).nullable(),
});
export type BulkWarning = z.infer<typeof bulkWarningSchema>;

export const bulkPreviewSchema = z.object({
  action: z.enum(BULK_ACTIONS),
  /** Prints in the selection. */
  total: z.number().int(),
  changing: z.number().int(), unchanged: z.number().int(), refused: z.number().int(),
  /** More than BULK_APPLY_MAX: the apply will be refused; narrow the search. */
  tooMany: z.boolean(),
  limit: z.number().int(),
  /** The first BULK_PREVIEW_ROWS prints, in catalogue order. */
  rows: z.array(bulkPreviewRowSchema),
  warnings: z.array(bulkWarningSchema),
  /** SHA-256 of the action and every selected print's id and version: the apply must send it back. */
  fingerprint: z.string(),
});
export type BulkPreview = z.infer<typeof bulkPreviewSchema>;

export const bulkResultSchema = z.object({
  action: z.enum(BULK_ACTIONS),
  changed: z.number().int(), unchanged: z.number().int(), refused: z.number().int(),
  /** Audit entries written: one per changed print. */
  auditEntries: z.number().int(),
});
export type BulkResult = z.infer<typeof bulkResultSchema>;

export const bulkExportBodySchema = z.object({ selection: printSelectionSchema });

// ── Saved searches ───────────────────────────────────────────────────────────
export const savedSearchInputSchema = z.object({
  name: z.string().trim().min(1, 'Name the search').max(200, 'At most 200 characters'),
  query: printSelectionQuerySchema.extend({ sort: printListQuerySchema.shape.sort }),
  /** Shared: everyone who reads the catalogue sees it in their list; otherwise only its owner. */
  shared: z.boolean().default(false),
});
/** A change names only what it changes (no default sharing), so a rename keeps the sharing. */
export const savedSearchUpdateSchema = savedSearchInputSchema.partial().extend({ shared: z.boolean().optional(), version: z.number().int().min(1) });
export const savedSearchSchema = z.object({
  id, name: z.string(), query: savedSearchInputSchema.shape.query, shared: z.boolean(), mine: z.boolean(),
  owner: z.object({ id, name: z.string() }), createdAt: isoDateTime, updatedAt: isoDateTime, version: z.number().int(),
});
export type SavedSearch = z.infer<typeof savedSearchSchema>;
