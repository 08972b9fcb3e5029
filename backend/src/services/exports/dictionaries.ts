import type { ExportName } from '@toneledger/common/schemas/exports';
import { AUDIT_COLUMNS } from '../audit-read.service';
import { READING_COLUMNS } from './readings-export';
import { CONDITION_REPORT_COLUMNS, LOAN_COLUMNS, MOVEMENT_COLUMNS } from './record-exports';
import { dictionaryCsv, dictionaryOf, type ExportColumn } from './columns';

/** Each export's columns: the one list its CSV header, cells and data dictionary are read from. */
export const EXPORT_COLUMNS: Record<ExportName, readonly ExportColumn<never>[]> = {
  'condition-reports': CONDITION_REPORT_COLUMNS as readonly ExportColumn<never>[],
  readings: READING_COLUMNS as readonly ExportColumn<never>[],
  movements: MOVEMENT_COLUMNS as readonly ExportColumn<never>[],
  loans: LOAN_COLUMNS as readonly ExportColumn<never>[],
  audit: AUDIT_COLUMNS as readonly ExportColumn<never>[],
};

export const exportDictionary = (name: ExportName) => dictionaryOf(EXPORT_COLUMNS[name]);
export const exportDictionaryCsv = (name: ExportName) => dictionaryCsv(EXPORT_COLUMNS[name]);
