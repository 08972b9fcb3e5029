import type { ClimateSettings } from '@toneledger/common/schemas/climate';

/** What the settings form's controls hold: figures as typed. */
export interface ClimateSettingsValues {
  target: { temperatureMinC: string; temperatureMaxC: string; rhMinPercent: string; rhMaxPercent: string };
  targetSource: string;
  reference: { temperatureC: string; rhPercent: string };
  activationEnergyKjMol: string;
  rhExponent: string;
  permanenceSource: string;
  briefExcursionMinutes: string;
  gapMinutes: string;
}

export function climateSettingsToValues(s: ClimateSettings): ClimateSettingsValues {
  return {
    target: { temperatureMinC: String(s.target.temperatureMinC), temperatureMaxC: String(s.target.temperatureMaxC), rhMinPercent: String(s.target.rhMinPercent), rhMaxPercent: String(s.target.rhMaxPercent) },
    targetSource: s.targetSource,
    reference: { temperatureC: String(s.reference.temperatureC), rhPercent: String(s.reference.rhPercent) },
    activationEnergyKjMol: String(s.activationEnergyKjMol),
    rhExponent: String(s.rhExponent),
    permanenceSource: s.permanenceSource,
    briefExcursionMinutes: String(s.briefExcursionMinutes),
    gapMinutes: String(s.gapMinutes),
  };
}

/** A typed figure as the schema should see it: a plain number is that number; anything else goes on as typed, so the schema refuses it. */
export function figure(value: string): number | string {
  const trimmed = value.trim();
  const n = Number(trimmed);
  return trimmed !== '' && Number.isFinite(n) ? n : value;
}

export function climateSettingsValuesToBody(v: ClimateSettingsValues) {
  return {
    target: { temperatureMinC: figure(v.target.temperatureMinC), temperatureMaxC: figure(v.target.temperatureMaxC), rhMinPercent: figure(v.target.rhMinPercent), rhMaxPercent: figure(v.target.rhMaxPercent) },
    targetSource: v.targetSource,
    reference: { temperatureC: figure(v.reference.temperatureC), rhPercent: figure(v.reference.rhPercent) },
    activationEnergyKjMol: figure(v.activationEnergyKjMol),
    rhExponent: figure(v.rhExponent),
    permanenceSource: v.permanenceSource,
    briefExcursionMinutes: figure(v.briefExcursionMinutes),
    gapMinutes: figure(v.gapMinutes),
  };
}
