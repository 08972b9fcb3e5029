import { DEFAULT_CLIMATE_SETTINGS } from '@toneledger/common/domain/isoperm';
import type { ClimateFile, ClimateRoom, ClimateSeries, ClimateSummary } from '@toneledger/common/schemas/climate';

export const LOCATION_ID = '6f1d2c1e-0b3a-4c55-9a7e-2d1f0c9b8a01';
export const FILE_ID = '0c9e8d7f-1a2b-4c3d-8e4f-5a6b7c8d9e0f';
const S = DEFAULT_CLIMATE_SETTINGS;

export function makeSummary(over: Partial<ClimateSummary> = {}): ClimateSummary {
  return {
    locationId: LOCATION_ID, locationLabel: 'Harbour Building › Store B', from: '2025-12-03', to: '2026-12-02', readings: 6, coveredMinutes: 240,
    gaps: [{ start: '2026-03-01T03:00:00.000Z', end: '2026-03-01T08:00:00.000Z', minutes: 300 }],
    temperature: { min: 16, max: 20, mean: 16.7 }, rh: { min: 45, max: 55, mean: 46.7 },
    outsideTemperature: 0.25, outsideRh: 0.25, outsideEither: 0.5,
    excursions: [{ quantity: 'temperature', direction: 'above', start: '2026-03-01T01:00:00.000Z', end: '2026-03-01T02:00:00.000Z', minutes: 60, peak: 20, brief: false }],
    permanence: 1.234,
    settings: { target: S.target, targetSource: S.targetSource, reference: S.reference, activationEnergyKjMol: S.activationEnergyKjMol, rhExponent: S.rhExponent, permanenceSource: S.permanenceSource },
    ...over,
  };
}

export const emptySeries = (): ClimateSeries => ({ locationId: LOCATION_ID, from: '2025-12-03', to: '2026-12-02', bucketMinutes: 526, points: [] });

export function makeFile(over: Partial<ClimateFile> = {}): ClimateFile {
  return {
    id: FILE_ID, locationId: LOCATION_ID, locationLabel: 'Harbour Building › Store B', fileName: 'store-b.csv', status: 'uploaded',
    columns: ['Time', 'Temp °C', 'RH %'], sample: [['2026-01-10 00:00', '17', '45'], ['2026-01-10 01:00', '17', '104']], rowCount: 2,
    suggestedMapping: { dateOrder: 'auto', timestampColumn: 'Time', temperatureColumn: 'Temp °C', temperatureUnit: 'C', rhColumn: 'RH %' },
    mapping: null, check: null, acceptedRows: null, uploadedBy: { id: 'a6a1b2c3-d4e5-4f60-8a7b-9c0d1e2f3a4b', name: 'Ines Varga' },
    uploadedAt: '2026-12-01T09:00:00.000Z', acceptedAt: null, ...over,
  };
}

export function makeRoom(over: Partial<ClimateRoom> = {}): ClimateRoom {
  return {
    locationId: LOCATION_ID, locationLabel: 'Harbour Building › Store B', printCount: 12, lastReadingAt: '2026-12-01T23:00:00.000Z', readings: 8760,
    temperatureMean: 16.2, rhMean: 44.1, outsideEither: 0.031, excursions: 2, permanence: 1.912, ...over,
  };
}
