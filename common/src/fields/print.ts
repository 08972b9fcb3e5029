import { z } from 'zod';
import type { CompatibilityCode } from '../domain/compatibility';
import { id } from '../schemas/primitives';
import { LIGHT_RESPONSIVITY, PAT_RESULT, PROCESS, STATUS, SUPPORT, TONER_CLASS } from '../schemas/vocab';
import {
  amount, code, enteredFields, rights, codeAsked, codeWithDefault, codes, currency, edtf, labeller, longText, millimetres, reference, requiredText, text,
  type FieldSpec,
} from './field';

/** The compatibility warnings a print can carry (see domain/compatibility), as codes and labels. */
const WARNING_LABELS: Record<CompatibilityCode, string> = {
  prussian_blue_in_buffered_enclosure: 'Iron blue in an alkaline-buffered enclosure',
  enclosure_without_pat: 'Enclosure not tested with the Photographic Activity Test',
  enclosure_failed_pat: 'Enclosure failed the Photographic Activity Test',
  alkaline_after_bath_on_iron_blue: 'Alkaline after-bath on iron blue',
  buffering_unknown_for_prussian_blue: 'Iron blue in an enclosure whose buffering is unknown',
  over_light_budget: 'On display past its light budget',
};
export const WARNING_CODES = {
  codes: Object.keys(WARNING_LABELS) as [CompatibilityCode, ...CompatibilityCode[]],
  labels: WARNING_LABELS,
};

const R = 'catalogue.read' as const;
const RESTRICTED = 'catalogue.read_restricted' as const;
/** Insurance valuations: registrars and administrators only. */
const VALUATION = 'valuation.read' as const;

/**
 * Every field of a print that leaves the server, in CSV column order. Adding a field here adds it to
 * the contract (input and output), the presenter, the CSV export and import, the import template,
 * the data dictionary and the form's labels and defaults. See DEVELOPERS.md, "Add a field to prints".
 */
export const PRINT_FIELDS = [
  {
    key: 'accessionNumber', inputKey: 'accessionNumber', label: 'Accession number', column: 'accession_number', read: R, origin: 'entered',
    ...requiredText(60, 'Enter the accession number'), list: true, sort: true, example: '1987.14.3',
    description: "The print's number in the collection, in the institution's pattern (a setting). An import matches existing prints by it, ignoring case.",
  },
  {
    key: 'title', inputKey: 'title', label: 'Title', column: 'title', read: R, origin: 'entered',
    ...requiredText(500, 'Enter a title (or a descriptive title in square brackets)'), list: true, sort: true, example: 'Harbour wall, low tide',
    description: "The maker's title, or a descriptive title in square brackets when the print has none.",
  },
  {
    key: 'maker', inputKey: 'makerId', label: 'Maker', column: 'maker', read: R, origin: 'entered',
    ...reference('maker', 'name', z.object({ id, name: z.string() })), sort: true, example: 'Wenna Trask',
    description: 'Who made the print. An import matches makers by name and creates a maker it does not find (listed before anything is written).',
  },
  {
    key: 'dateMade', inputKey: 'dateMade', label: 'Date made', column: 'date_made', read: R, origin: 'entered',
    ...edtf('EDTF, e.g. 1968, 1968-04~, 196X, 1971?, 1964/1969'), list: true, sort: true, example: '1968-04~',
    description: 'When the print was made, in EDTF: 1968, 1968-04, 1968-04~ (about), 1971? (uncertain), 196X (the 1960s), 1964/1969 (between).',
  },
  {
    key: 'process', inputKey: 'process', label: 'Process', column: 'process', read: R, origin: 'entered',
    ...codeAsked('the processes', PROCESS, 'gelatin_silver_developing_out'), list: true, example: 'gelatin_silver_developing_out',
    description: 'The photographic process of the print. An import reads the code or its label.',
  },
  {
    key: 'support', inputKey: 'support', label: 'Support', column: 'support', read: R, origin: 'entered',
    ...code('the supports', SUPPORT), list: true, example: 'fibre_baryta',
    description: 'What the image layer sits on: fibre-based (baryta) or resin-coated paper.',
  },
  {
    key: 'paper', inputKey: 'paperId', label: 'Paper', column: 'paper', read: R, origin: 'entered',
    ...reference('paper', 'manufacturer, product and surface as listed under Papers', z.object({ id, label: z.string() })), example: 'Fennick Lustre, pearl',
    description: 'The photographic paper, as listed under Papers ("manufacturer product, surface"). Add a paper there before importing prints on it.',
  },
  {
    key: 'status', inputKey: 'status', label: 'Status', column: 'status', read: R, origin: 'entered',
    ...codeWithDefault('the statuses', STATUS, 'in_store'), list: true, sort: true, example: 'in_store',
    description: 'Where the print stands: in store, on display, on loan, in treatment or deaccessioned.',
  },
  {
    key: 'location', inputKey: 'locationId', label: 'Location', column: 'location', read: RESTRICTED, origin: 'entered',
    ...reference('location', 'path (Store › Cabinet › Box) or code', z.object({ id, pathLabel: z.string() })), createOnly: true,
    example: 'Store A › Cabinet 2',
    description: 'Where the print is kept, as a path of places or a place code. Set when the print is catalogued; afterwards each change is a movement (an import records one).',
  },
  {
    key: 'enclosure', inputKey: 'enclosureId', label: 'Enclosure', column: 'enclosure', read: R, origin: 'entered',
    ...reference(
      'enclosure', 'name',
      z.object({ id, name: z.string(), alkalineBuffered: z.boolean().nullable(), patResult: z.enum(PAT_RESULT.codes) }),
    ),
    example: 'Polyester sleeve',
    description: 'The enclosure type the print is housed in, as listed under Enclosures. Its buffering and test result feed the warnings.',
  },
  {
    key: 'lightResponsivity', label: 'Light responsivity', column: 'light_responsivity', read: R, origin: 'computed',
    ...code('the light responsivity categories (CIE 157:2004)', LIGHT_RESPONSIVITY), example: 'medium',
    description:
      "How quickly the print responds to light, as a CIE 157 category: a conservator's override (with a reason) where there is one, " +
      'otherwise the default the light settings give its process and toner classes.',
    importNote: 'Computed from the process and toner classes (a conservator overrides it on the print page); ignored on import.',
  },
  {
    key: 'imageHeightMm', inputKey: 'imageHeightMm', label: 'Image height', column: 'image_height_mm', read: R, origin: 'entered',
    ...millimetres(), example: '180', description: 'Height of the image area.',
  },
  {
    key: 'imageWidthMm', inputKey: 'imageWidthMm', label: 'Image width', column: 'image_width_mm', read: R, origin: 'entered',
    ...millimetres(), example: '240', description: 'Width of the image area.',
  },
  {
    key: 'sheetHeightMm', inputKey: 'sheetHeightMm', label: 'Sheet height', column: 'sheet_height_mm', read: R, origin: 'entered',
    ...millimetres(), example: '203', description: 'Height of the paper sheet.',
  },
  {
    key: 'sheetWidthMm', inputKey: 'sheetWidthMm', label: 'Sheet width', column: 'sheet_width_mm', read: R, origin: 'entered',
    ...millimetres(), example: '254', description: 'Width of the paper sheet.',
  },
  {
    key: 'mountHeightMm', inputKey: 'mountHeightMm', label: 'Mount height', column: 'mount_height_mm', read: R, origin: 'entered',
    ...millimetres(), example: '430', description: 'Height of the mount, when the print is mounted.',
  },
  {
    key: 'mountWidthMm', inputKey: 'mountWidthMm', label: 'Mount width', column: 'mount_width_mm', read: R, origin: 'entered',
    ...millimetres(), example: '355', description: 'Width of the mount, when the print is mounted.',
  },
  {
    key: 'inscriptions', inputKey: 'inscriptions', label: 'Inscriptions', column: 'inscriptions', read: R, origin: 'entered',
    ...longText(5000), example: 'Verso, pencil: Harbour 68', description: 'Signatures, stamps and writing on the print or its mount, with where they are.',
  },
  {
    key: 'provenance', inputKey: 'provenance', label: 'Provenance', column: 'provenance', read: R, origin: 'entered',
    ...longText(5000), example: 'Gift of the maker, 1987', description: 'Who owned the print before the collection, as far as known.',
  },
  {
    key: 'creditLine', inputKey: 'creditLine', label: 'Credit line', column: 'credit_line', read: R, origin: 'entered',
    ...text(500), example: 'Gift of Wenna Trask, 1987', description: 'The wording to use when the print is shown or reproduced.',
  },
  {
    key: 'rights', inputKey: 'rights', label: 'Rights statement', column: 'rights', read: R, origin: 'entered',
    ...rights(), example: 'http://rightsstatements.org/vocab/InC/1.0/',
    description:
      'The copyright status of the print and what others may do with its images, as the URI of a Creative Commons licence or public-domain tool ' +
      '(http://creativecommons.org/licenses/by-nc/4.0/) or a RightsStatements.org statement (http://rightsstatements.org/vocab/InC-RUU/1.0/). ' +
      "IIIF manifests carry it as `rights`; the credit line goes with it as the manifest's required statement.",
    importNote: 'An https address, a missing closing slash or a licence\'s deed page is read as the licence; any other text is refused.',
  },
  {
    key: 'staffNotes', inputKey: 'staffNotes', label: 'Staff notes', column: 'staff_notes', read: RESTRICTED, origin: 'entered',
    ...longText(10000), example: 'Matched to the negative register, volume 3.', description: 'Notes for staff only: never shown to viewers.',
  },
  {
    key: 'valuationAmount', inputKey: 'valuationAmount', label: 'Valuation amount', column: 'valuation_amount', read: VALUATION, origin: 'entered',
    ...amount(), example: '1200', description: 'The current insurance valuation, in the valuation currency. Read by registrars and administrators only.',
  },
  {
    key: 'valuationCurrency', inputKey: 'valuationCurrency', label: 'Valuation currency', column: 'valuation_currency', read: VALUATION, origin: 'entered',
    ...currency(), example: 'GBP', description: 'The currency of the valuation, as an ISO 4217 code (GBP, EUR, USD…); a code in small letters is kept in capitals. Read by registrars and administrators only.',
  },
  {
    key: 'tonerClasses', label: 'Toners', column: 'toner_classes', read: R, origin: 'computed',
    ...codes('the toner classes', TONER_CLASS), list: true, example: 'selenium;gold',
    description: 'The toner classes of the toning steps in the process history, in order.',
    importNote: 'Computed from the process history. A new print with no rows in the steps file gets one toning step per class; otherwise the column is ignored.',
  },
  {
    key: 'warnings', label: 'Warnings', column: 'warnings', read: R, origin: 'computed',
    type: { kind: 'codes', vocabulary: 'the compatibility warnings', codes: WARNING_CODES.codes, labels: WARNING_LABELS }, required: false, default: null,
    example: 'prussian_blue_in_buffered_enclosure',
    description: 'Compatibility warnings computed from the process, the process history and the enclosure, and the light warning from its display periods.',
    importNote: 'Computed; ignored on import.',
  },
  {
    key: 'borrowed', label: 'Borrowed', column: 'borrowed', read: R, origin: 'system', type: { kind: 'yes_no' }, required: false, default: null,
    output: z.boolean(), example: 'no',
    description: 'Lent to the collection by another institution (a loan in), not part of it; the catalogue list hides it unless asked.',
    importNote: 'Kept by the server (set when a print is recorded on a loan in); ignored on import.',
  },
  {
    key: 'id', label: 'Record id', column: 'id', read: R, origin: 'system', type: { kind: 'id' }, required: false, default: null,
    output: id, list: true, example: '11111111-2222-4333-8444-555555555555',
    description: "The record's id in Toneledger (used in its web address).",
    importNote: 'Kept by the server; ignored on import (prints are matched by accession number).',
  },
  {
    key: 'updatedAt', label: 'Last changed', column: 'updated_at', read: R, origin: 'system', type: { kind: 'timestamp' }, required: false, default: null,
    output: z.string().datetime(), list: true, sort: true, example: '2024-06-01T10:00:00.000Z',
    description: 'When the record was last changed.',
    importNote: 'Kept by the server; ignored on import.',
  },
] as const satisfies readonly FieldSpec[];

export type PrintFieldSpec = (typeof PRINT_FIELDS)[number];
export type PrintFieldKey = PrintFieldSpec['key'];

/** Keys of the contract's print that are not columns of their own: shown on screen, derived, or carried by the steps file. */
export const PRINT_KEYS_BEYOND_FIELDS = ['dateDisplay', 'dateEarliest', 'dateLatest', 'steps', 'version', 'createdAt'] as const;

/** The label of a print field by its key, input key (`makerId`) or CSV column, with its unit: "Image width (mm)". */
export const labelOf = labeller(PRINT_FIELDS, {
  steps: 'Process history',
  dateDisplay: 'Date made, as read',
  dateEarliest: 'Earliest date',
  dateLatest: 'Latest date',
  version: 'Version',
  createdAt: 'Catalogued',
});

/** One field by its key, input key or CSV column. */
export function printField(key: string): PrintFieldSpec | undefined {
  return PRINT_FIELDS.find((f) => f.key === key || ('inputKey' in f && f.inputKey === key) || f.column === key);
}

/** Fields a person enters (the form, the import): everything that is not computed or kept by the server. */
export const ENTERED_PRINT_FIELDS = enteredFields(PRINT_FIELDS);
