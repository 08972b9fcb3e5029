import { imagesApi } from '@toneledger/common/api/images';
import { blankValues } from '@toneledger/common/fields/field';
import { PRINT_FIELDS } from '@toneledger/common/fields/print';
import type { Print } from '@toneledger/common/schemas/catalogue';
import type { ConditionReport, ConditionTerm, Observation } from '@toneledger/common/schemas/condition';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { urlOf } from '@/lib/api-client';
import { json } from '@/test/fetch-mock';

export const PRINT_ID = '11111111-2222-4333-8444-555555555555';
export const REPORT_ID = 'a1111111-2222-4333-8444-555555555555';
export const IMAGE_OLD = 'b1111111-2222-4333-8444-555555555555';
export const IMAGE_NEW = 'b2111111-2222-4333-8444-555555555555';
export const IMAGE_VERSO = 'b3111111-2222-4333-8444-555555555555';
/** The id of `makeMe(...)` in the shared test fixtures: the signed-in person. */
export const ME_ID = '5d0c0f5e-8a7b-4c2d-9e1f-112233445566';
export const OTHER_ID = '6e0c0f5e-8a7b-4c2d-9e1f-112233445566';

/** A whole print; `blankValues` gives every public field that may be empty its null, so a new field needs no change here. */
export function makePrint(overrides: Partial<Print> = {}): Print {
  return {
    ...blankValues(PRINT_FIELDS),
    id: PRINT_ID, accessionNumber: '1987.14.3', title: 'Harbour wall, low tide', maker: null, dateMade: null, dateDisplay: null, dateEarliest: null,
    dateLatest: null, imageWidthMm: null, imageHeightMm: null, sheetWidthMm: null, sheetHeightMm: null, mountWidthMm: null, mountHeightMm: null,
    process: 'gelatin_silver_developing_out', support: 'fibre_baryta', paper: null, inscriptions: null, provenance: null, creditLine: null,
    status: 'in_store', borrowed: false, enclosure: null, lightResponsivity: null, tonerClasses: ['iron_blue'],
    warnings: [{ code: 'prussian_blue_in_buffered_enclosure', severity: 'high', message: 'Iron blue in a buffered enclosure.', basis: 'Guidance.' }],
    steps: [], version: 3, createdAt: '2024-01-01T10:00:00.000Z', updatedAt: '2024-06-01T10:00:00.000Z', ...overrides,
  };
}

export function makeImage(overrides: Partial<PrintImage> = {}): PrintImage {
  const id = overrides.id ?? IMAGE_OLD;
  return {
    id, printId: PRINT_ID, viewType: 'recto', capturedOn: '1995-05-02', notes: null, fileName: 'recto-1995.tif', contentType: 'image/tiff',
    sizeBytes: 2_400_000, width: 4000, height: 3000, sha256: 'a'.repeat(64),
    exif: { capturedAt: null, make: 'Camera Co', model: 'Model 5', lens: null, exposureTime: 0.008, fNumber: 8, iso: 100, focalLength: 50 },
    derivatives: 'ready', urls: { thumb: urlOf(imagesApi.file, { params: { id, variant: 'thumb' } }), screen: urlOf(imagesApi.file, { params: { id, variant: 'screen' } }), original: null },
    lastFixity: null, uploadedAt: '2024-01-02T10:00:00.000Z', uploadedBy: 'Ada Marsh', withdrawn: null, version: 1, ...overrides,
  };
}

export const images: PrintImage[] = [
  makeImage(),
  makeImage({ id: IMAGE_NEW, capturedOn: '2024-03-11', fileName: 'recto-2024.tif' }),
  makeImage({ id: IMAGE_VERSO, viewType: 'verso', capturedOn: '2010-01-01', fileName: 'verso.tif' }),
];

export const terms: ConditionTerm[] = [
  { code: 'silver_mirroring', label: 'Silver mirroring', description: null, active: true, builtIn: true },
  { code: 'foxing', label: 'Foxing', description: null, active: true, builtIn: true },
  { code: 'old_term', label: 'Old term', description: null, active: false, builtIn: false },
];

export const GRADE_DEFINITIONS = {
  good: 'House definition of good: stable, nothing active.',
  fair: 'House definition of fair: visible but stable damage.',
  poor: 'House definition of poor: active deterioration.',
  unacceptable: 'House definition of unacceptable: withdraw from use.',
};

export function makeObservation(overrides: Partial<Observation> = {}): Observation {
  return {
    id: 'c1111111-2222-4333-8444-555555555555', position: 1, termCode: 'silver_mirroring', termLabel: 'Silver mirroring', side: 'recto', area: 'margin',
    extent: 'localised', extentPercent: null, severity: 'slight', notes: 'Upper margin', region: null, ...overrides,
  };
}

export function makeReport(overrides: Partial<ConditionReport> = {}): ConditionReport {
  return {
    id: REPORT_ID, printId: PRINT_ID, accessionNumber: '1987.14.3', printTitle: 'Harbour wall, low tide', examinedOn: '2024-03-12',
    examinerId: ME_ID, examinerName: 'Iris Penhale', context: 'routine', grade: 'fair', summary: 'Slight mirroring at the upper margin.',
    recommendations: null, nextCheckOn: null, status: 'draft', signedAt: null, observations: [makeObservation()], addenda: [], loan: null, version: 2,
    createdAt: '2024-03-12T10:00:00.000Z', updatedAt: '2024-03-12T10:00:00.000Z', ...overrides,
  };
}

/** The reads every condition screen makes. */
export function conditionHandlers(report: ConditionReport | null = null) {
  return {
    [`GET /api/prints/${PRINT_ID}`]: () => json({ data: makePrint() }),
    [`GET /api/prints/${PRINT_ID}/images`]: () => json({ data: images }),
    'GET /api/condition-terms': () => json({ data: terms }),
    'GET /api/settings/condition': () => json({ data: { grades: GRADE_DEFINITIONS } }),
    'GET /api/settings/catalogue': () => json({ data: { accessionPattern: 'YYYY.N.N', institutionName: 'Westcombe Photographic Trust' } }),
    ...(report ? { [`GET /api/condition-reports/${report.id}`]: () => json({ data: report }) } : {}),
  };
}
