import { describe, expect, it } from 'vitest';
import { ciede2000FromParts, ciede2000Parts } from './ciede2000-parts';
import { deltaE00 } from './colour';

// Sharma, Wu & Dalal (2005), Color Res. Appl. 30(1):21–30, Table 1 (REFERENCES.md §1, published):
// [pair, L1, a1, b1, L2, a2, b2, ΔE00]. The components are checked by putting them back together:
// the published ΔE00 must come out, in both orders.
const SHARMA_TABLE_1: [number, number, number, number, number, number, number, string][] = [
  [1, 50, 2.6772, -79.7751, 50, 0, -82.7485, '2.0425'],
  [2, 50, 3.1571, -77.2803, 50, 0, -82.7485, '2.8615'],
  [3, 50, 2.8361, -74.02, 50, 0, -82.7485, '3.4412'],
  [4, 50, -1.3802, -84.2814, 50, 0, -82.7485, '1.0000'],
  [5, 50, -1.1848, -84.8006, 50, 0, -82.7485, '1.0000'],
  [6, 50, -0.9009, -85.5211, 50, 0, -82.7485, '1.0000'],
  [7, 50, 0, 0, 50, -1, 2, '2.3669'],
  [8, 50, -1, 2, 50, 0, 0, '2.3669'],
  [9, 50, 2.49, -0.001, 50, -2.49, 0.0009, '7.1792'],
  [10, 50, 2.49, -0.001, 50, -2.49, 0.001, '7.1792'],
  [11, 50, 2.49, -0.001, 50, -2.49, 0.0011, '7.2195'],
  [12, 50, 2.49, -0.001, 50, -2.49, 0.0012, '7.2195'],
  [13, 50, -0.001, 2.49, 50, 0.0009, -2.49, '4.8045'],
  [14, 50, -0.001, 2.49, 50, 0.001, -2.49, '4.8045'],
  [15, 50, -0.001, 2.49, 50, 0.0011, -2.49, '4.7461'],
  [16, 50, 2.5, 0, 50, 0, -2.5, '4.3065'],
  [17, 50, 2.5, 0, 73, 25, -18, '27.1492'],
  [18, 50, 2.5, 0, 61, -5, 29, '22.8977'],
  [19, 50, 2.5, 0, 56, -27, -3, '31.9030'],
  [20, 50, 2.5, 0, 58, 24, 15, '19.4535'],
  [21, 50, 2.5, 0, 50, 3.1736, 0.5854, '1.0000'],
  [22, 50, 2.5, 0, 50, 3.2972, 0, '1.0000'],
  [23, 50, 2.5, 0, 50, 1.8634, 0.5757, '1.0000'],
  [24, 50, 2.5, 0, 50, 3.2592, 0.335, '1.0000'],
];

describe('ciede2000Parts against Sharma, Wu & Dalal 2005 Table 1 (REFERENCES.md §1, published)', () => {
  it.each(SHARMA_TABLE_1)('pair %i: the parts give the published ΔE00 in both orders', (_n, L1, a1, b1, L2, a2, b2, expected) => {
    const x = { L: L1, a: a1, b: b1 };
    const y = { L: L2, a: a2, b: b2 };
    expect(ciede2000FromParts(ciede2000Parts(x, y)).toFixed(4)).toBe(expected);
    expect(ciede2000FromParts(ciede2000Parts(y, x)).toFixed(4)).toBe(expected);
    // and culori's ΔE00 (an independent implementation from the npm registry) to 1e-9
    expect(ciede2000FromParts(ciede2000Parts(x, y))).toBeCloseTo(deltaE00(x, y), 9);
  });

  it('ΔL′ is ΔL*; ΔC′ differs from ΔC*ab where a* is scaled by G', () => {
    // Pair 1: b dominates, G ≈ 0, so ΔC′ ≈ ΔC*ab; pair 17 has chroma near 0 at the baseline, G large.
    const p17 = ciede2000Parts({ L: 50, a: 2.5, b: 0 }, { L: 73, a: 25, b: -18 });
    expect(p17.dLPrime).toBe(23);
    const dCab = Math.hypot(25, -18) - 2.5; // CIELAB chroma difference (definition)
    expect(Math.abs(p17.dCPrime - dCab)).toBeGreaterThan(0.5);
    // "later minus baseline": swapping the readings changes the signs
    const back = ciede2000Parts({ L: 73, a: 25, b: -18 }, { L: 50, a: 2.5, b: 0 });
    expect(back.dLPrime).toBe(-23);
    expect(back.dCPrime).toBeCloseTo(-p17.dCPrime, 12);
    expect(back.dHPrime).toBeCloseTo(-p17.dHPrime, 12);
  });

  it('refuses a colour that is not finite', () => {
    expect(() => ciede2000Parts({ L: Number.NaN, a: 0, b: 0 }, { L: 50, a: 0, b: 0 })).toThrow(RangeError);
  });
});
