/**
 * Colour and density arithmetic for readings taken at registered spots on a print.
 *
 * CIEDE2000 is delegated to culori's `differenceCiede2000`, which reproduces every pair of
 * Sharma, Wu & Dalal (2005) Table 1 to four decimals (see colour.test.ts), so no local
 * implementation of the formula is kept. L*a*b* values are passed to culori in its `lab65` mode
 * because that is the space its difference function works in: a colour already in that mode is
 * used as given, with no white-point adaptation. The numbers are whatever the instrument reported;
 * whether two readings may be compared at all is decided by `comparable` on their measurement
 * conditions, never by converting here.
 */
import { differenceCiede2000, modeLab65, useMode } from 'culori/fn';

useMode(modeLab65);

const ciede2000 = differenceCiede2000();

/** A CIELAB colour as reported by the instrument (L* in 0–100, a* and b* unbounded). */
export interface Lab {
  L: number;
  a: number;
  b: number;
}

function assertLab(c: Lab, what: string): void {
  if (!Number.isFinite(c.L) || !Number.isFinite(c.a) || !Number.isFinite(c.b)) {
    throw new RangeError(`${what} must have finite L, a and b (got ${c.L}, ${c.a}, ${c.b})`);
  }
}

/** CIEDE2000 colour difference with kL = kC = kH = 1. Symmetric in its two arguments. */
export function deltaE00(x: Lab, y: Lab): number {
  assertLab(x, 'first colour');
  assertLab(y, 'second colour');
  return ciede2000({ mode: 'lab65', l: x.L, a: x.a, b: x.b }, { mode: 'lab65', l: y.L, a: y.a, b: y.b });
}

/** CIE 1976 colour difference: the Euclidean distance in L*a*b*. */
export function deltaE76(x: Lab, y: Lab): number {
  assertLab(x, 'first colour');
  assertLab(y, 'second colour');
  return Math.hypot(y.L - x.L, y.a - x.a, y.b - x.b);
}

/** Chroma C*ab = sqrt(a*² + b*²). */
export function chroma(c: Lab): number {
  return Math.hypot(c.a, c.b);
}

/** Hue angle h_ab in degrees, in [0, 360). A neutral colour (a* = b* = 0) is given 0. */
export function hueAngleDeg(c: Lab): number {
  if (c.a === 0 && c.b === 0) return 0;
  const h = (Math.atan2(c.b, c.a) * 180) / Math.PI;
  return h < 0 ? h + 360 : h;
}

/**
 * Differences from a baseline reading to a later one, all "later minus baseline".
 *
 * - `dL` = L*₂ − L*₁: positive means the spot got lighter.
 * - `dC` = C*ab₂ − C*ab₁: positive means more chroma (more saturated).
 * - `dH` = ΔH*ab = 2·sqrt(C₁·C₂)·sin(Δh/2), with Δh = h₂ − h₁ wrapped into (−180°, 180°].
 *   Its sign is the sign of Δh: positive means the hue angle increased (turned counter-clockwise
 *   in the a*b* plane, e.g. from +b* yellow towards −a* green). Its magnitude equals
 *   sqrt(ΔE76² − ΔL² − ΔC²), so ΔE76² = ΔL² + ΔC² + ΔH² holds exactly. When either colour
 *   is neutral (C = 0) the hue is undefined and `dH` is 0.
 * - `dHueDeg` = Δh in degrees, wrapped into (−180, 180] (0 when either colour is neutral).
 */
export interface LabDifference {
  dL: number;
  dC: number;
  dH: number;
  dHueDeg: number;
  dE76: number;
  dE00: number;
}

export function labDifference(baseline: Lab, later: Lab): LabDifference {
  assertLab(baseline, 'baseline colour');
  assertLab(later, 'later colour');
  const c1 = chroma(baseline);
  const c2 = chroma(later);
  let dh = 0;
  if (c1 > 0 && c2 > 0) {
    dh = hueAngleDeg(later) - hueAngleDeg(baseline);
    if (dh > 180) dh -= 360;
    else if (dh <= -180) dh += 360;
  }
  return {
    dL: later.L - baseline.L,
    dC: c2 - c1,
    dH: 2 * Math.sqrt(c1 * c2) * Math.sin((dh * Math.PI) / 360),
    dHueDeg: dh,
    dE76: deltaE76(baseline, later),
    dE00: deltaE00(baseline, later),
  };
}

export type DominantChange = 'lightening' | 'darkening' | 'loss of chroma' | 'gain of chroma' | 'hue shift';

export interface ChangeClassification {
  /** The component with the largest magnitude; null when the two readings are identical. */
  dominant: DominantChange | null;
  /**
   * Share of ΔE76² carried by each component: ΔL²/ΔE76², ΔC²/ΔE76², ΔH²/ΔE76². They sum to 1
   * (all 0 when there is no change).
   */
  shares: { lightness: number; chroma: number; hue: number };
  difference: LabDifference;
}

/**
 * Names the dominant kind of change from a baseline reading to a later one by comparing the
 * magnitudes of ΔL*, ΔC*ab and ΔH*ab. These three are in the same units and are orthogonal
 * (ΔE76² = ΔL² + ΔC² + ΔH²), so the largest one is the plain-language "main" change; no
 * perceptual weighting is applied. On a tie the order lightness, chroma, hue decides.
 */
export function classifyChange(baseline: Lab, later: Lab): ChangeClassification {
  const d = labDifference(baseline, later);
  const total = d.dL * d.dL + d.dC * d.dC + d.dH * d.dH;
  if (total === 0) {
    return { dominant: null, shares: { lightness: 0, chroma: 0, hue: 0 }, difference: d };
  }
  const shares = { lightness: (d.dL * d.dL) / total, chroma: (d.dC * d.dC) / total, hue: (d.dH * d.dH) / total };
  const aL = Math.abs(d.dL);
  const aC = Math.abs(d.dC);
  const aH = Math.abs(d.dH);
  let dominant: DominantChange;
  if (aL >= aC && aL >= aH) dominant = d.dL > 0 ? 'lightening' : 'darkening';
  else if (aC >= aH) dominant = d.dC < 0 ? 'loss of chroma' : 'gain of chroma';
  else dominant = 'hue shift';
  return { dominant, shares, difference: d };
}

// ---------------------------------------------------------------------------------------------
// Reflection density

/** Reflection density D = −log10(R) for a reflectance factor R in (0, 1]. */
export function densityFromReflectance(reflectance: number): number {
  if (!Number.isFinite(reflectance) || reflectance <= 0 || reflectance > 1) {
    throw new RangeError(`reflectance must be in (0, 1] (got ${reflectance})`);
  }
  // 0 rather than −0 for a perfect reflector.
  return reflectance === 1 ? 0 : -Math.log10(reflectance);
}

/** Converts a reflectance given in percent (0, 100] to a factor in (0, 1]. */
export function reflectanceFromPercent(percent: number): number {
  if (!Number.isFinite(percent) || percent <= 0 || percent > 100) {
    throw new RangeError(`reflectance percent must be in (0, 100] (got ${percent})`);
  }
  return percent / 100;
}

/** Reflection density from a reflectance given in percent: D = −log10(percent / 100). */
export function densityFromReflectancePercent(percent: number): number {
  return densityFromReflectance(reflectanceFromPercent(percent));
}

export interface DensityChange {
  /** ΔD = D − D0; negative when the spot lost density (faded). */
  deltaD: number;
  /**
   * (D0 − D) / D0 × 100: percentage of the baseline density lost at this spot; negative when
   * density was gained. Null when the baseline density is 0, where a percentage has no meaning.
   */
  percentLoss: number | null;
}

export function densityChange(baselineDensity: number, density: number): DensityChange {
  if (!Number.isFinite(baselineDensity) || !Number.isFinite(density) || baselineDensity < 0 || density < 0) {
    throw new RangeError(`densities must be finite and ≥ 0 (got ${baselineDensity}, ${density})`);
  }
  return {
    deltaD: density - baselineDensity,
    percentLoss: baselineDensity === 0 ? null : ((baselineDensity - density) / baselineDensity) * 100,
  };
}

// ---------------------------------------------------------------------------------------------
// Measurement conditions

export interface MeasurementConditions {
  illuminant: 'D50' | 'D65' | 'A' | 'F2' | 'F11' | (string & {});
  observer: '2' | '10';
  geometry: '45/0' | '0/45' | 'd/8' | 'd/0' | (string & {});
  condition?: 'M0' | 'M1' | 'M2' | 'M3' | null;
}

export type Comparability = { ok: true } | { ok: false; reason: string };

const normIlluminant = (s: string) => s.trim().toUpperCase();
// "45°/0°", "45 / 0" and "45/0" name the same geometry; so do "D/8" and "d/8".
const normGeometry = (s: string) => s.replace(/[°\s]/g, '').toLowerCase();

/**
 * Whether readings taken under `baseline` and `later` conditions may be compared directly.
 * Illuminant, observer and geometry must match (illuminant compared case-insensitively, geometry
 * ignoring spaces, degree signs and case); the M-condition must match when both record one.
 * No conversion between conditions is attempted: a mismatch is refused with a reason.
 */
export function comparable(baseline: MeasurementConditions, later: MeasurementConditions): Comparability {
  const illuminantDiffers = normIlluminant(baseline.illuminant) !== normIlluminant(later.illuminant);
  const observerDiffers = baseline.observer !== later.observer;
  const geometryDiffers = normGeometry(baseline.geometry) !== normGeometry(later.geometry);
  const conditionDiffers = baseline.condition != null && later.condition != null && baseline.condition !== later.condition;
  if (!illuminantDiffers && !observerDiffers && !geometryDiffers && !conditionDiffers) return { ok: true };

  const describe = (c: MeasurementConditions) => {
    const extra: string[] = [];
    if (geometryDiffers) extra.push(`${c.geometry.trim()} geometry`);
    if (conditionDiffers) extra.push(`measurement condition ${c.condition}`);
    return `${c.illuminant.trim()}/${c.observer}°${extra.length ? ` (${extra.join(', ')})` : ''}`;
  };
  const verdict = illuminantDiffers || observerDiffers ? 'not comparable without conversion' : 'not comparable';
  return { ok: false, reason: `Baseline measured under ${describe(baseline)}, this session under ${describe(later)}: ${verdict}` };
}

// ---------------------------------------------------------------------------------------------
// Repeated readings at one spot

export interface ReadingSummary {
  n: number;
  mean: Lab;
  /** Sample standard deviation (n − 1 denominator) per channel; null for a single reading. */
  sd: Lab | null;
  /** Largest CIEDE2000 difference between any two of the readings (0 for a single reading). */
  maxPairwiseDeltaE00: number;
}

/** Mean and spread of several readings taken at the same spot in one session. */
export function averageReadings(readings: readonly Lab[]): ReadingSummary {
  if (readings.length === 0) throw new RangeError('averageReadings needs at least one reading');
  readings.forEach((r, i) => assertLab(r, `reading ${i + 1}`));
  const n = readings.length;
  const mean: Lab = {
    L: readings.reduce((s, r) => s + r.L, 0) / n,
    a: readings.reduce((s, r) => s + r.a, 0) / n,
    b: readings.reduce((s, r) => s + r.b, 0) / n,
  };
  const sd =
    n < 2
      ? null
      : {
          L: Math.sqrt(readings.reduce((s, r) => s + (r.L - mean.L) ** 2, 0) / (n - 1)),
          a: Math.sqrt(readings.reduce((s, r) => s + (r.a - mean.a) ** 2, 0) / (n - 1)),
          b: Math.sqrt(readings.reduce((s, r) => s + (r.b - mean.b) ** 2, 0) / (n - 1)),
        };
  let maxPairwiseDeltaE00 = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      maxPairwiseDeltaE00 = Math.max(maxPairwiseDeltaE00, deltaE00(readings[i], readings[j]));
    }
  }
  return { n, mean, sd, maxPairwiseDeltaE00 };
}
