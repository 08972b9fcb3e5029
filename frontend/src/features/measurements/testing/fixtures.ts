import { blankValues } from '@toneledger/common/fields/field';
import { PRINT_FIELDS } from '@toneledger/common/fields/print';
import { printListItemSchema, type Print, type PrintListItem } from '@toneledger/common/schemas/catalogue';
import type { PrintImage } from '@toneledger/common/schemas/images';
import type { MeasurementSession, PrintMeasurements, Spot, SpotAnalysis } from '@toneledger/common/schemas/measurements';

export const PRINT_ID = 'a1111111-2222-4333-8444-555555555555';
export const SPOT_ID = 'b1111111-2222-4333-8444-555555555555';
export const SPOT2_ID = 'b2111111-2222-4333-8444-555555555555';
export const SESSION1_ID = 'c1111111-2222-4333-8444-555555555555';
export const SESSION2_ID = 'c2111111-2222-4333-8444-555555555555';
export const SESSION3_ID = 'c3111111-2222-4333-8444-555555555555';
export const IMAGE_ID = 'd1111111-2222-4333-8444-555555555555';

/** A whole print; `blankValues` gives every public field that may be empty its null, so a new field needs no change here. */
export function makePrint(overrides: Partial<Print> = {}): Print {
  return {
    ...blankValues(PRINT_FIELDS),
    id: PRINT_ID,
    accessionNumber: '1979.3.12',
    title: 'Quay cranes in fog',
    maker: null,
    dateMade: '1961',
    dateDisplay: '1961',
    dateEarliest: '1961-01-01',
    dateLatest: '1961-12-31',
    imageWidthMm: 240, imageHeightMm: 180, sheetWidthMm: null, sheetHeightMm: null, mountWidthMm: null, mountHeightMm: null,
    process: 'gelatin_silver_developing_out',
    support: 'fibre_baryta',
    paper: null,
    inscriptions: null, provenance: null, creditLine: null,
    status: 'in_store',
    borrowed: false,
    enclosure: null,
    lightResponsivity: 'medium',
    tonerClasses: ['iron_blue'],
    warnings: [],
    steps: [],
    location: null,
    staffNotes: null, valuationAmount: null, valuationCurrency: null,
    version: 2,
    createdAt: '2024-01-01T10:00:00.000Z',
    updatedAt: '2024-06-01T10:00:00.000Z',
    ...overrides,
  };
}

/** The print as the catalogue's list answers it (what the print finder's search returns). */
export function makeListItem(print: Print = makePrint()): PrintListItem {
  return printListItemSchema.parse({ ...print, makerName: null, paperLabel: null, enclosureName: null, warningCodes: [] });
}

export function makeSpot(overrides: Partial<Spot> = {}): Spot {
  return {
    id: SPOT_ID, printId: PRINT_ID, name: 'Sky, upper left', purpose: 'mid_tone', point: { imageId: IMAGE_ID, x: 0.2, y: 0.15 }, notes: null,
    baseline: null, version: 1, ...overrides,
  };
}

export function makeSession(overrides: Partial<MeasurementSession> = {}): MeasurementSession {
  return {
    id: SESSION1_ID, printId: PRINT_ID, measuredOn: '2000-05-03', measuredBy: 'Tamsin Rowe', instrument: 'Handheld spectro S-1', serial: 'SN 4471',
    illuminant: 'D50', observer: '2', geometry: '45/0', condition: 'M0', aperture: '4 mm', backing: 'White card', notes: null,
    readings: [
      {
        spotId: SPOT_ID, spotName: 'Sky, upper left', mean: { L: 50, a: 0, b: -82.7485 }, n: 3, sd: { L: 0.1, a: 0.05, b: 0.12 },
        maxPairwiseDeltaE00: 0.2, density: 1.2, densityType: 'visual', reflectance: null,
      },
    ],
    createdAt: '2000-05-03T12:00:00.000Z',
    ...overrides,
  };
}

export function makeAnalysis(overrides: Partial<SpotAnalysis> = {}): SpotAnalysis {
  return {
    spot: makeSpot(),
    baseline: { sessionId: SESSION1_ID, measuredOn: '2000-05-03', lab: { L: 50, a: 0, b: -82.7485 }, density: 1.2, chosen: false },
    points: [
      { sessionId: SESSION1_ID, measuredOn: '2000-05-03', lab: { L: 50, a: 0, b: -82.7485 }, comparable: true, reason: null, dE00: 0, dE76: 0, dL: 0, dC: 0, dH: 0, dLPrime: 0, dCPrime: 0, dHPrime: 0, dominant: null, density: 1.2, dD: 0, densityLossPercent: 0 },
      { sessionId: SESSION2_ID, measuredOn: '2012-05-03', lab: { L: 50.5, a: 0.8, b: -80.1 }, comparable: false, reason: 'Baseline measured under D50/2°, this session under D65/10°: not comparable without conversion', dE00: null, dE76: null, dL: null, dC: null, dH: null, dLPrime: null, dCPrime: null, dHPrime: null, dominant: null, density: null, dD: null, densityLossPercent: null },
      { sessionId: SESSION3_ID, measuredOn: '2024-05-03', lab: { L: 51.2, a: 1.9, b: -78.2 }, comparable: true, reason: null, dE00: 1.42, dE76: 4.9, dL: 1.2, dC: -4.3, dH: 1.1, dLPrime: 1.2, dCPrime: -4.1, dHPrime: 1.3, dominant: 'loss of chroma', density: 1.1, dD: -0.1, densityLossPercent: 8.33 },
    ],
    rate: { ok: true, slopePerYear: 0.0592, intercept: 0.01, standardError: 0.01, ci95: [0.04, 0.08], n: 6, spanYears: 24, r2: 0.93 },
    densityChangeRate: null,
    densityLossRate: null,
    projection: {
      reached: true, alreadyReached: false, threshold: 2,
      date: '2031-03-14T00:00:00.000Z', interval: { earliest: '2029-06-01T00:00:00.000Z', latest: '2036-02-01T00:00:00.000Z' },
    },
    ...overrides,
  };
}

export function makeMeasurements(overrides: Partial<PrintMeasurements> = {}): PrintMeasurements {
  return {
    threshold: 2,
    thresholdGuidance: 'ΔE00 2.0 is a setting of this collection, not a constant.',
    spots: [makeAnalysis()],
    sessions: [makeSession()],
    ...overrides,
  };
}

export function makeImage(overrides: Partial<PrintImage> = {}): PrintImage {
  return {
    id: IMAGE_ID, printId: PRINT_ID, viewType: 'recto', capturedOn: '2024-05-03', notes: null, fileName: 'recto.tif', contentType: 'image/tiff',
    sizeBytes: 1000, width: 2000, height: 1500, sha256: 'a'.repeat(64),
    exif: { capturedAt: null, make: null, model: null, lens: null, exposureTime: null, fNumber: null, iso: null, focalLength: null },
    derivatives: 'ready', urls: { thumb: '/img/thumb.jpg', screen: '/img/screen.jpg', original: null }, lastFixity: null,
    uploadedAt: '2024-05-03T12:00:00.000Z', uploadedBy: 'Tamsin Rowe', withdrawn: null, version: 1, ...overrides,
  };
}
