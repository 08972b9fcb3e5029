import { describe, expect, it } from 'vitest';
import { mean as ssMean, sampleStandardDeviation } from 'simple-statistics';
import {
  averageReadings,
  chroma,
  classifyChange,
  comparable,
  deltaE00,
  deltaE76,
  densityChange,
  densityFromReflectance,
  densityFromReflectancePercent,
  hueAngleDeg,
  labDifference,
  reflectanceFromPercent,
  type Lab,
  type MeasurementConditions,
} from './colour';

// Sharma, Wu & Dalal (2005), "The CIEDE2000 color-difference formula: implementation notes,
// supplementary test data, and mathematical observations", Color Res. Appl. 30(1):21–30,
// Table 1 (REFERENCES.md §1, published): [pair, L1, a1, b1, L2, a2, b2, ΔE00].
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
const pair = (n: number): [Lab, Lab] => {
  const r = SHARMA_TABLE_1[n - 1];
  return [
    { L: r[1], a: r[2], b: r[3] },
    { L: r[4], a: r[5], b: r[6] },
  ];
};

describe('deltaE00 against Sharma, Wu & Dalal 2005 Table 1 (REFERENCES.md §1, published)', () => {
  it('has all 24 pairs', () => {
    expect(SHARMA_TABLE_1.map((r) => r[0])).toEqual(Array.from({ length: 24 }, (_, i) => i + 1));
  });

  it.each(SHARMA_TABLE_1)('pair %i matches the table to 4 decimals in both orders', (_n, L1, a1, b1, L2, a2, b2, expected) => {
    const x = { L: L1, a: a1, b: b1 };
    const y = { L: L2, a: a2, b: b2 };
    expect(deltaE00(x, y).toFixed(4)).toBe(expected);
    expect(deltaE00(y, x).toFixed(4)).toBe(expected);
    // ΔE00 is symmetric in its two colours (Sharma et al. 2005).
    expect(deltaE00(y, x)).toBeCloseTo(deltaE00(x, y), 12);
  });

  it('is zero for a colour against itself and refuses non-finite input', () => {
    expect(deltaE00({ L: 50, a: 2.5, b: 0 }, { L: 50, a: 2.5, b: 0 })).toBe(0);
    expect(() => deltaE00({ L: Number.NaN, a: 0, b: 0 }, { L: 50, a: 0, b: 0 })).toThrow(RangeError);
  });
});

describe('deltaE76', () => {
  it('pair 1 gives 4.0011 and pair 7 gives 2.2361 (REFERENCES.md §1, computed)', () => {
    expect(deltaE76(...pair(1)).toFixed(4)).toBe('4.0011');
    expect(deltaE76(...pair(7)).toFixed(4)).toBe('2.2361');
    expect(deltaE76(pair(7)[1], pair(7)[0]).toFixed(4)).toBe('2.2361');
  });
});

describe('chroma and hue angle', () => {
  it('follow C = sqrt(a² + b²) and h = atan2(b, a) in [0, 360) (hand arithmetic)', () => {
    // (0, −2.5): C = 2.5, h = 270°; (−1, 2): C = √5 = 2.2361, h = 180° − atan(2) = 116.5651°.
    expect(chroma({ L: 50, a: 0, b: -2.5 })).toBe(2.5);
    expect(hueAngleDeg({ L: 50, a: 0, b: -2.5 })).toBeCloseTo(270, 10);
    expect(chroma({ L: 50, a: -1, b: 2 })).toBeCloseTo(2.2361, 4);
    expect(hueAngleDeg({ L: 50, a: -1, b: 2 })).toBeCloseTo(116.5651, 4);
    expect(hueAngleDeg({ L: 50, a: 0, b: 0 })).toBe(0);
  });
});

describe('labDifference: ΔL*, ΔC*ab, ΔH*ab', () => {
  it('pair 16 is a pure hue change: ΔH = 2·2.5·sin(−45°) = −3.5355 = −ΔE76 (hand arithmetic)', () => {
    // (2.5, 0) has h = 0°, (0, −2.5) has h = 270°; Δh wraps to −90°. C is 2.5 for both.
    const d = labDifference(...pair(16));
    expect(d.dL).toBe(0);
    expect(d.dC).toBeCloseTo(0, 12);
    expect(d.dHueDeg).toBeCloseTo(-90, 10);
    expect(d.dH.toFixed(4)).toBe('-3.5355');
    expect(d.dE76.toFixed(4)).toBe('3.5355');
    expect(d.dE00.toFixed(4)).toBe('4.3065'); // Sharma et al. 2005 Table 1, pair 16
  });

  it('pair 7 from neutral: all change is chroma, ΔC = √5 = 2.2361 = ΔE76, ΔH = 0 (hand arithmetic)', () => {
    const d = labDifference(...pair(7));
    expect(d.dC.toFixed(4)).toBe('2.2361');
    expect(d.dH).toBe(0);
    expect(d.dE76.toFixed(4)).toBe('2.2361'); // REFERENCES.md §1, computed
    expect(d.dE00.toFixed(4)).toBe('2.3669'); // Sharma et al. 2005 Table 1, pair 7
  });

  it('pair 1: ΔC = 2.9285, ΔH = −2.7263 and ΔL² + ΔC² + ΔH² = ΔE76² = 4.0011² (computed from the table inputs)', () => {
    // C1 = 79.8200, C2 = 82.7485; h1 = 271.9221°, h2 = 270° → Δh = −1.9221°;
    // ΔH = 2·sqrt(79.8200·82.7485)·sin(−0.96104°) = −2.7263. ΔH*ab is defined so that
    // ΔE*ab² = ΔL*² + ΔC*ab² + ΔH*ab² (CIE 15:2004 — recalled from memory, confirmed by these numbers).
    const d = labDifference(...pair(1));
    expect(d.dC.toFixed(4)).toBe('2.9285');
    expect(d.dH.toFixed(4)).toBe('-2.7263');
    expect(d.dHueDeg.toFixed(4)).toBe('-1.9221');
    expect(Math.sqrt(d.dL ** 2 + d.dC ** 2 + d.dH ** 2).toFixed(4)).toBe('4.0011');
  });

  it('ΔH is positive when the hue angle increases (hand arithmetic)', () => {
    // (0, 20) h = 90° → (−5, 20) h = 104.0362°; C 20 → 20.6155; ΔE76 = 5;
    // ΔH = 2·sqrt(20·20.6155)·sin(7.0181°) = 4.9620 = +sqrt(5² − 0.6155²).
    const base = { L: 50, a: 0, b: 20 };
    const later = { L: 50, a: -5, b: 20 };
    expect(labDifference(base, later).dH.toFixed(4)).toBe('4.9620');
    expect(labDifference(later, base).dH.toFixed(4)).toBe('-4.9620');
  });
});

describe('classifyChange', () => {
  it('names a pure hue change a hue shift (Sharma pair 16 inputs)', () => {
    const c = classifyChange(...pair(16));
    expect(c.dominant).toBe('hue shift');
    expect(c.shares.hue).toBeCloseTo(1, 10);
  });

  it('names chroma loss and gain (Sharma pair 7 inputs, both directions)', () => {
    const [neutral, coloured] = pair(7);
    expect(classifyChange(coloured, neutral).dominant).toBe('loss of chroma');
    expect(classifyChange(neutral, coloured).dominant).toBe('gain of chroma');
  });

  it('names lightening and darkening when ΔL dominates', () => {
    // ΔL = ±5, ΔC = ∓1 (C 20 → 19), ΔH = 0.
    const a = { L: 50, a: 0, b: -20 };
    const b = { L: 55, a: 0, b: -19 };
    expect(classifyChange(a, b).dominant).toBe('lightening');
    expect(classifyChange(b, a).dominant).toBe('darkening');
    expect(classifyChange(a, b).shares.lightness).toBeCloseTo(25 / 26, 10);
  });

  it('a constructed blue fading: chroma loss just above the hue shift (hand arithmetic)', () => {
    // (45, −5, −30) → (47, −8, −25): ΔL = 2; C 30.414 → 26.249, ΔC = −4.165;
    // h 260.54° → 252.26°, ΔH = 2·sqrt(30.414·26.249)·sin(−4.14°) = −4.08.
    const c = classifyChange({ L: 45, a: -5, b: -30 }, { L: 47, a: -8, b: -25 });
    expect(c.difference.dC.toFixed(2)).toBe('-4.17');
    expect(c.difference.dH.toFixed(2)).toBe('-4.08');
    expect(c.dominant).toBe('loss of chroma');
  });

  it('gives no dominant change for identical readings', () => {
    const x = { L: 40, a: -10, b: -20 };
    expect(classifyChange(x, { ...x })).toMatchObject({ dominant: null, shares: { lightness: 0, chroma: 0, hue: 0 } });
  });
});

describe('reflection density (REFERENCES.md §7, definition D = −log10 R)', () => {
  it('R = 0.1 → 1.000 and R = 0.5 → 0.3010', () => {
    expect(densityFromReflectance(0.1).toFixed(3)).toBe('1.000');
    expect(densityFromReflectance(0.5).toFixed(4)).toBe('0.3010');
    expect(densityFromReflectance(1)).toBe(0);
    expect(Object.is(densityFromReflectance(1), -0)).toBe(false);
  });

  it('accepts reflectance in percent: 10 % → 1.000, 50 % → 0.3010', () => {
    expect(reflectanceFromPercent(50)).toBe(0.5);
    expect(densityFromReflectancePercent(10).toFixed(3)).toBe('1.000');
    expect(densityFromReflectancePercent(50).toFixed(4)).toBe('0.3010');
  });

  it('refuses reflectance outside (0, 1] or (0, 100] %', () => {
    for (const r of [0, -0.1, 1.2, Number.NaN]) expect(() => densityFromReflectance(r)).toThrow(RangeError);
    for (const p of [0, 100.5, Number.POSITIVE_INFINITY]) expect(() => reflectanceFromPercent(p)).toThrow(RangeError);
  });

  it('ΔD and percentage loss relative to the baseline density', () => {
    // Baseline R = 0.1 (D0 = 1.000), later R = 0.5 (D = 0.3010): ΔD = −0.6990, loss = 69.90 %.
    const ch = densityChange(densityFromReflectance(0.1), densityFromReflectance(0.5));
    expect(ch.deltaD.toFixed(4)).toBe('-0.6990');
    expect(ch.percentLoss?.toFixed(2)).toBe('69.90');
    // 1.20 → 0.90: ΔD = −0.30, loss = 0.30/1.20 = 25 %; a gain gives a negative loss.
    const c2 = densityChange(1.2, 0.9);
    expect(c2.deltaD).toBeCloseTo(-0.3, 12);
    expect(c2.percentLoss).toBeCloseTo(25, 10);
    expect(densityChange(0.8, 1.0).percentLoss).toBeCloseTo(-25, 10);
    expect(densityChange(0, 0.1).percentLoss).toBeNull();
    expect(() => densityChange(-1, 0.5)).toThrow(RangeError);
  });
});

describe('comparable measurement conditions', () => {
  const d50: MeasurementConditions = { illuminant: 'D50', observer: '2', geometry: '45/0', condition: 'M1' };

  it('matching conditions are comparable, allowing case, spaces and degree signs', () => {
    expect(comparable(d50, { ...d50 })).toEqual({ ok: true });
    expect(comparable(d50, { illuminant: ' d50', observer: '2', geometry: '45°/0°', condition: 'M1' })).toEqual({ ok: true });
  });

  it('refuses a different illuminant and observer with the reason from the issue', () => {
    const r = comparable({ ...d50, condition: null }, { illuminant: 'D65', observer: '10', geometry: '45/0' });
    expect(r).toEqual({
      ok: false,
      reason: 'Baseline measured under D50/2°, this session under D65/10°: not comparable without conversion',
    });
  });

  it('refuses an observer change alone', () => {
    const r = comparable(d50, { ...d50, observer: '10' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toBe('Baseline measured under D50/2°, this session under D50/10°: not comparable without conversion');
  });

  it('refuses a different geometry, naming both', () => {
    const r = comparable(d50, { ...d50, geometry: 'd/8' });
    expect(r).toEqual({
      ok: false,
      reason: 'Baseline measured under D50/2° (45/0 geometry), this session under D50/2° (d/8 geometry): not comparable',
    });
  });

  it('checks the M-condition only when both readings record one', () => {
    const r = comparable(d50, { ...d50, condition: 'M2' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/measurement condition M1\).*measurement condition M2\)/);
    expect(comparable(d50, { ...d50, condition: null })).toEqual({ ok: true });
    expect(comparable(d50, { illuminant: 'D50', observer: '2', geometry: '45/0' })).toEqual({ ok: true });
  });
});

describe('averageReadings', () => {
  it('sample SD per channel: 2,4,4,4,5,5,7,9 has mean 5 and sample SD sqrt(32/7) = 2.1381', () => {
    // The data set is the worked example of the "Standard deviation" article in Wikipedia
    // (recalled from memory; population SD 2). Squared deviations 9,1,1,1,0,0,4,16 sum to 32.
    const ls = [2, 4, 4, 4, 5, 5, 7, 9];
    const readings = ls.map((L, i) => ({ L, a: -10 + i, b: -20 }));
    const s = averageReadings(readings);
    expect(s.n).toBe(8);
    expect(s.mean.L).toBe(5);
    expect(s.sd?.L.toFixed(4)).toBe('2.1381');
    expect(s.sd?.b).toBe(0);
    // Second opinion: simple-statistics.
    expect(s.mean.a).toBeCloseTo(ssMean(readings.map((r) => r.a)), 12);
    expect(s.sd?.a).toBeCloseTo(sampleStandardDeviation(readings.map((r) => r.a)), 12);
  });

  it('max pairwise ΔE00 uses Sharma et al. 2005 Table 1 pairs 17 and 21', () => {
    const [c1, c2] = pair(17);
    const s = averageReadings([c1, c2, { ...c1 }]);
    expect(s.maxPairwiseDeltaE00.toFixed(4)).toBe('27.1492');
    // Means by hand: L (50+73+50)/3 = 57.6667, a (2.5+25+2.5)/3 = 10, b −18/3 = −6.
    expect(s.mean.L.toFixed(4)).toBe('57.6667');
    expect(s.mean.a).toBeCloseTo(10, 12);
    expect(s.mean.b).toBeCloseTo(-6, 12);
    expect(averageReadings(pair(21)).maxPairwiseDeltaE00.toFixed(4)).toBe('1.0000');
  });

  it('a single reading has no SD and no spread; none is an error', () => {
    expect(averageReadings([{ L: 50, a: 1, b: 2 }])).toEqual({ n: 1, mean: { L: 50, a: 1, b: 2 }, sd: null, maxPairwiseDeltaE00: 0 });
    expect(() => averageReadings([])).toThrow(RangeError);
  });
});
