import type { Print } from '@toneledger/common/schemas/catalogue';
import { LIGHT_RESPONSIVITY, PROCESS, STATUS, SUPPORT } from '@toneledger/common/schemas/vocab';
import { fieldList } from '@/lib/forms/stale-edit';

/** The fields of a print that the form edits (location is set on create, and moved afterwards). */
export const PRINT_FIELDS = [
  'accessionNumber', 'title', 'makerId', 'dateMade', 'process', 'support', 'paperId', 'status', 'lightResponsivity',
  'imageWidthMm', 'imageHeightMm', 'sheetWidthMm', 'sheetHeightMm', 'mountWidthMm', 'mountHeightMm', 'enclosureId',
  'inscriptions', 'provenance', 'creditLine', 'staffNotes', 'valuationAmount', 'valuationCurrency',
] as const;
export type PrintField = (typeof PRINT_FIELDS)[number];

/** What the form holds: every field as the text in its control. */
export type PrintFormValues = Record<PrintField | 'locationId', string>;

export const FIELD_LABELS: Record<PrintField | 'locationId', string> = {
  accessionNumber: 'Accession number',
  title: 'Title',
  makerId: 'Maker',
  dateMade: 'Date made',
  process: 'Process',
  support: 'Support',
  paperId: 'Paper',
  status: 'Status',
  lightResponsivity: 'Light responsivity',
  imageWidthMm: 'Image width (mm)',
  imageHeightMm: 'Image height (mm)',
  sheetWidthMm: 'Sheet width (mm)',
  sheetHeightMm: 'Sheet height (mm)',
  mountWidthMm: 'Mount width (mm)',
  mountHeightMm: 'Mount height (mm)',
  enclosureId: 'Enclosure',
  inscriptions: 'Inscriptions',
  provenance: 'Provenance',
  creditLine: 'Credit line',
  staffNotes: 'Staff notes',
  valuationAmount: 'Valuation amount',
  valuationCurrency: 'Valuation currency',
  locationId: 'Location',
};

/** The edited fields with their labels, in form order (for the stale-edit review). */
export const PRINT_FORM_FIELDS = fieldList(Object.fromEntries(PRINT_FIELDS.map((f) => [f, FIELD_LABELS[f]])) as Record<PrintField, string>);

export function emptyPrintValues(): PrintFormValues {
  const values = Object.fromEntries([...PRINT_FIELDS, 'locationId'].map((field) => [field, ''])) as PrintFormValues;
  values.process = 'gelatin_silver_developing_out';
  values.status = 'in_store';
  return values;
}

const text = (value: string | number | null | undefined) => (value === null || value === undefined ? '' : String(value));

export function printToValues(print: Print): PrintFormValues {
  return {
    accessionNumber: print.accessionNumber,
    title: print.title,
    makerId: print.maker?.id ?? '',
    dateMade: text(print.dateMade),
    process: print.process,
    support: text(print.support),
    paperId: print.paper?.id ?? '',
    status: print.status,
    lightResponsivity: text(print.lightResponsivity),
    imageWidthMm: text(print.imageWidthMm),
    imageHeightMm: text(print.imageHeightMm),
    sheetWidthMm: text(print.sheetWidthMm),
    sheetHeightMm: text(print.sheetHeightMm),
    mountWidthMm: text(print.mountWidthMm),
    mountHeightMm: text(print.mountHeightMm),
    enclosureId: print.enclosure?.id ?? '',
    inscriptions: text(print.inscriptions),
    provenance: text(print.provenance),
    creditLine: text(print.creditLine),
    staffNotes: text(print.staffNotes),
    valuationAmount: text(print.valuationAmount),
    valuationCurrency: text(print.valuationCurrency),
    locationId: print.location?.id ?? '',
  };
}

/**
 * The form's values as the request body. Typed fields go as typed (the schema trims them, reads
 * numbers and turns empty text into null); an empty choice in a list that may be empty is null, and
 * in a list that must be answered (process, status) it is left out, so the schema says so.
 */
export function printValuesToBody(values: PrintFormValues): Record<string, unknown> {
  const body: Record<string, unknown> = { ...values };
  for (const field of ['support', 'lightResponsivity'] as const) body[field] = values[field] === '' ? null : values[field];
  for (const field of ['process', 'status'] as const) if (values[field] === '') delete body[field];
  return body;
}

/** How a code field of the form reads to a person. */
export function describeCode(field: PrintField, value: string): string {
  switch (field) {
    case 'process':
      return PROCESS.labels[value as keyof typeof PROCESS.labels] ?? value;
    case 'support':
      return SUPPORT.labels[value as keyof typeof SUPPORT.labels] ?? value;
    case 'status':
      return STATUS.labels[value as keyof typeof STATUS.labels] ?? value;
    case 'lightResponsivity':
      return LIGHT_RESPONSIVITY.labels[value as keyof typeof LIGHT_RESPONSIVITY.labels] ?? value;
    default:
      return value;
  }
}
