import type { ClimateSettings } from '../schemas/climate';

/**
 * Relative permanence of a storage climate by the isoperm model (REFERENCES.md §3): the rate of
 * chemical deterioration follows Arrhenius in temperature and is proportional to RH^n, so the
 * permanence of climate 2 against reference climate 1 is
 *   P2/P1 = (RH1/RH2)^n · exp[(Ea/R)(1/T2 − 1/T1)], T in kelvin.
 * Sebera (1994) publishes permanence as such ratios; the closed form above is the one commonly
 * used [memory — verify], so Ea and n are settings shown beside every figure.
 */
export const GAS_CONSTANT = 8.314462618; // J/(mol·K), CODATA 2018 exact value

export interface IsopermConstants {
  reference: { temperatureC: number; rhPercent: number };
  activationEnergyKjMol: number;
  rhExponent: number;
}

/** Permanence of one climate against the reference (1 = as lasting as the reference, 2 = twice as long). */
export function relativePermanence(temperatureC: number, rhPercent: number, c: IsopermConstants): number {
  if (!(rhPercent > 0)) throw new RangeError('RH must be above 0 % for the isoperm model');
  const t = temperatureC + 273.15;
  const tRef = c.reference.temperatureC + 273.15;
  const humidity = Math.pow(c.reference.rhPercent / rhPercent, c.rhExponent);
  return humidity * Math.exp(((c.activationEnergyKjMol * 1000) / GAS_CONSTANT) * (1 / t - 1 / tRef));
}

/**
 * Time-weighted permanence of a varying climate: deterioration adds up as the time-average of the
 * rate, so the permanence of the whole period is the inverse of the time-weighted mean of 1/P
 * (a week at permanence 0.5 is not made good by a week at 2: the mean rate is 1.25, P = 0.8).
 * `spans` are (minutes, °C, %RH); null when nothing is covered.
 */
export function timeWeightedPermanence(spans: Iterable<{ minutes: number; temperatureC: number; rhPercent: number }>, c: IsopermConstants): number | null {
  let minutes = 0;
  let rate = 0;
  for (const s of spans) {
    if (!(s.minutes > 0)) continue;
    minutes += s.minutes;
    rate += s.minutes / relativePermanence(s.temperatureC, Math.max(s.rhPercent, 0.1), c);
  }
  return minutes > 0 ? minutes / rate : null;
}

/**
 * The defaults of the climate settings. Target: ISO 18920 extended-term storage for black-and-white
 * silver gelatin prints, ≤ 18 °C at 30–50 % RH (REFERENCES.md §5, [memory — verify]); the lower
 * temperature bound is this product's choice (no freezing of an uncontrolled room). Reference climate
 * 20 °C / 50 % RH and Ea 83.68 kJ/mol (20 kcal/mol), RH exponent 1, as in REFERENCES.md §3.
 */
export const DEFAULT_CLIMATE_SETTINGS: ClimateSettings = {
  target: { temperatureMinC: 2, temperatureMaxC: 18, rhMinPercent: 30, rhMaxPercent: 50 },
  targetSource: 'ISO 18920 extended-term storage of black-and-white silver gelatin prints: at most 18 °C, 30–50 % RH (value recalled, verify against the standard); the 2 °C floor is a choice of this installation.',
  reference: { temperatureC: 20, rhPercent: 50 },
  activationEnergyKjMol: 83.68,
  rhExponent: 1,
  permanenceSource: 'Isoperm model: D. K. Sebera, Isoperms: An Environmental Management Tool (Commission on Preservation and Access, 1994); P = (RHref/RH)^n · exp[(Ea/R)(1/T − 1/Tref)] (the common form, verify), against 20 °C / 50 % RH. See also Strang & Grattan, "The isoperm revisited" (2009).',
  briefExcursionMinutes: 60,
  gapMinutes: 180,
};
