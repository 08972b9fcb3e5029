import { z } from 'zod';
import { leadersQuerySchema } from './measurements';
import { loanListQuerySchema } from './loans';
import { id } from './primitives';

/**
 * Exports of the list screens (condition reports, measurement readings, movements, loans, the audit
 * trail) as CSV and JSON, each with a data dictionary. The CSVs are UTF-8 with a byte-order mark, so
 * a spreadsheet opened by double-click reads the accents and symbols (ΔE00, °C) right.
 */
export const EXPORT_NAMES = ['condition-reports', 'readings', 'movements', 'loans', 'audit'] as const;
export type ExportName = (typeof EXPORT_NAMES)[number];

export const exportNameParamsSchema = z.object({ name: z.enum(EXPORT_NAMES) });

/** The readings of one print (its measurements page) or of the leaders list's filter (process, toner). */
export const readingsExportQuerySchema = leadersQuerySchema.pick({ process: true, tonerClass: true }).extend({ printId: id.optional() });
export type ReadingsExportQuery = z.infer<typeof readingsExportQuerySchema>;

/** The loans list's filters without paging. */
export const loansExportQuerySchema = loanListQuerySchema.omit({ page: true, pageSize: true });
export type LoansExportQuery = z.infer<typeof loansExportQuerySchema>;

/** One column of an export as its data dictionary lists it. */
export const dictionaryEntrySchema = z.object({
  column: z.string(),
  meaning: z.string(),
  type: z.string(),
  unit: z.string().nullable(),
  source: z.string(),
});
export type DictionaryEntry = z.infer<typeof dictionaryEntrySchema>;
