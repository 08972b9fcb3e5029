import { printInputSchema, type Print, type PrintInput, type PrintUpdate } from '@toneledger/common/schemas/catalogue';
import { LIGHT_RESPONSIVITY, PROCESS, STATUS, SUPPORT } from '@toneledger/common/schemas/vocab';
import { formatDimensions } from '@/features/catalogue/utils/format';
import { issuesToErrors, type Checked, type FieldErrors } from '@/lib/form-errors';

export { serverIssuesToErrors } from '@/lib/form-errors';
export type { Checked, FieldErrors };

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

/** Fields typed by hand are sent as typed; an empty choice means "none". Required fields stay '' so their message shows. */
function raw(values: PrintFormValues, fields: readonly string[]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const field of fields) {
    const value = values[field as keyof PrintFormValues];
    if (field === 'accessionNumber' || field === 'title') out[field] = value;
    else if (field === 'process' || field === 'status') out[field] = value === '' ? undefined : value;
    else out[field] = value === '' ? null : value;
  }
  return out;
}

const editSchema = printInputSchema.omit({ locationId: true });

/** The create form checked with the same schema the server uses. */
export function checkCreate(values: PrintFormValues): Checked<PrintInput> {
  const result = printInputSchema.safeParse(raw(values, [...PRINT_FIELDS, 'locationId']));
  return result.success ? { ok: true, data: result.data } : { ok: false, errors: issuesToErrors(result.error.issues) };
}

/** Fields whose text differs from the record the edit started from. */
export function changedFields(base: PrintFormValues, values: PrintFormValues): PrintField[] {
  return PRINT_FIELDS.filter((field) => values[field] !== base[field]);
}

/**
 * The edit form checked with the shared schema; the update carries only the fields the person
 * changed, on top of the version the edit started from.
 */
export function checkUpdate(base: PrintFormValues, values: PrintFormValues, version: number): Checked<PrintUpdate> {
  const result = editSchema.safeParse(raw(values, PRINT_FIELDS));
  if (!result.success) return { ok: false, errors: issuesToErrors(result.error.issues) };
  const update: Record<string, unknown> = { version };
  const parsed = result.data as Record<string, unknown>;
  for (const field of changedFields(base, values)) update[field] = parsed[field] ?? null;
  return { ok: true, data: update as PrintUpdate };
}

/** How a field of a saved record reads to a person (names and labels, not ids and codes). */
export function describePrintField(print: Print, field: PrintField): string {
  switch (field) {
    case 'makerId':
      return print.maker?.name ?? '';
    case 'paperId':
      return print.paper?.label ?? '';
    case 'enclosureId':
      return print.enclosure?.name ?? '';
    case 'process':
      return PROCESS.labels[print.process];
    case 'support':
      return print.support ? SUPPORT.labels[print.support] : '';
    case 'status':
      return STATUS.labels[print.status];
    case 'lightResponsivity':
      return print.lightResponsivity ? LIGHT_RESPONSIVITY.labels[print.lightResponsivity] : '';
    default:
      return printToValues(print)[field];
  }
}

export interface StaleChange {
  field: PrintField;
  label: string;
  opened: string;
  now: string;
  /** The person had changed this field too: their value differs from the one they opened. */
  alsoChangedByYou: boolean;
}

/** What someone else changed between the record the form opened and the record as it is now. */
export function staleChanges(opened: Print, current: Print, mine: PrintFormValues): StaleChange[] {
  const before = printToValues(opened);
  const now = printToValues(current);
  return PRINT_FIELDS.filter((field) => before[field] !== now[field]).map((field) => ({
    field,
    label: FIELD_LABELS[field],
    opened: describePrintField(opened, field),
    now: describePrintField(current, field),
    alsoChangedByYou: mine[field] !== before[field],
  }));
}

/**
 * Puts the person's edits on top of the current record: a field they changed keeps their value,
 * every other field takes the current value. Nothing typed is lost, nothing of theirs is overwritten.
 */
export function rebaseValues(opened: Print, current: Print, mine: PrintFormValues): PrintFormValues {
  const before = printToValues(opened);
  const now = printToValues(current);
  const next = { ...mine };
  for (const field of PRINT_FIELDS) if (mine[field] === before[field]) next[field] = now[field];
  return next;
}

export { formatDimensions };
