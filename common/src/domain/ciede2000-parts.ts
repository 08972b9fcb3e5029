/**
 * The three CIEDE2000 components between two readings, "later minus baseline", and the weights the
 * formula applies to them (G. Sharma, W. Wu, E. N. Dalal, Color Research & Application 30(1):21–30,
 * 2005, equations 1–22; kL = kC = kH = 1):
 *
 *   ΔE00 = sqrt((ΔL′/SL)² + (ΔC′/SC)² + (ΔH′/SH)² + RT·(ΔC′/SC)·(ΔH′/SH))
 *
 * ΔL′ equals ΔL* (L′ = L*). ΔC′ and ΔH′ are computed on a′ = (1 + G)·a*, so they are not ΔC*ab and
 * ΔH*ab: screens label them ΔL′, ΔC′, ΔH′, and keep ΔL*, Δa*, Δb* for ΔE*ab (CIE76).
 * ΔE00 itself stays culori's (`deltaE00` in colour.ts); the test recombines these parts into it.
 */
import type { Lab } from './colour';

export interface Ciede2000Parts {
  dLPrime: number;
  dCPrime: number;
  dHPrime: number;
  sL: number;
  sC: number;
  sH: number;
  rT: number;
}

const deg = (r: number) => (r * 180) / Math.PI;
const rad = (d: number) => (d * Math.PI) / 180;
const POW25_7 = 25 ** 7;

function hueDeg(b: number, aPrime: number): number {
  if (aPrime === 0 && b === 0) return 0;
  const h = deg(Math.atan2(b, aPrime));
  return h < 0 ? h + 360 : h;
}

export function ciede2000Parts(baseline: Lab, later: Lab): Ciede2000Parts {
  for (const c of [baseline, later]) {
    if (!Number.isFinite(c.L) || !Number.isFinite(c.a) || !Number.isFinite(c.b)) throw new RangeError('colours must have finite L, a and b');
  }
  const cBar = (Math.hypot(baseline.a, baseline.b) + Math.hypot(later.a, later.b)) / 2;
  const g = 0.5 * (1 - Math.sqrt(cBar ** 7 / (cBar ** 7 + POW25_7)));
  const a1 = (1 + g) * baseline.a;
  const a2 = (1 + g) * later.a;
  const c1 = Math.hypot(a1, baseline.b);
  const c2 = Math.hypot(a2, later.b);
  const h1 = hueDeg(baseline.b, a1);
  const h2 = hueDeg(later.b, a2);

  let dh = 0;
  if (c1 * c2 !== 0) {
    dh = h2 - h1;
    if (dh > 180) dh -= 360;
    else if (dh < -180) dh += 360;
  }
  const dLPrime = later.L - baseline.L;
  const dCPrime = c2 - c1;
  const dHPrime = 2 * Math.sqrt(c1 * c2) * Math.sin(rad(dh) / 2);

  const lBar = (baseline.L + later.L) / 2;
  const cBarPrime = (c1 + c2) / 2;
  let hBar = h1 + h2;
  if (c1 * c2 !== 0) {
    if (Math.abs(h1 - h2) <= 180) hBar = (h1 + h2) / 2;
    else if (h1 + h2 < 360) hBar = (h1 + h2 + 360) / 2;
    else hBar = (h1 + h2 - 360) / 2;
  }
  const t = 1 - 0.17 * Math.cos(rad(hBar - 30)) + 0.24 * Math.cos(rad(2 * hBar)) + 0.32 * Math.cos(rad(3 * hBar + 6)) - 0.2 * Math.cos(rad(4 * hBar - 63));
  const dTheta = 30 * Math.exp(-(((hBar - 275) / 25) ** 2));
  const rC = 2 * Math.sqrt(cBarPrime ** 7 / (cBarPrime ** 7 + POW25_7));
  const l50 = (lBar - 50) ** 2;
  return {
    dLPrime, dCPrime, dHPrime,
    sL: 1 + (0.015 * l50) / Math.sqrt(20 + l50),
    sC: 1 + 0.045 * cBarPrime,
    sH: 1 + 0.015 * cBarPrime * t,
    rT: -Math.sin(rad(2 * dTheta)) * rC,
  };
}

/** ΔE00 put together from its parts (equation 22 of Sharma et al. 2005). */
export function ciede2000FromParts(p: Ciede2000Parts): number {
  const l = p.dLPrime / p.sL;
  const c = p.dCPrime / p.sC;
  const h = p.dHPrime / p.sH;
  return Math.sqrt(l * l + c * c + h * h + p.rT * c * h);
}
