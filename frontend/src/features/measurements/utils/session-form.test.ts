import { describe, expect, it } from 'vitest';
import { checkSession, emptySessionValues, errorKey, previewSpot, type SessionFormValues } from '@/features/measurements/utils/session-form';
import { makeSession, SPOT2_ID, SPOT_ID } from '@/features/measurements/testing/fixtures';

const baseline = { sessionId: makeSession().id, measuredOn: '2000-05-03', lab: { L: 50, a: 0, b: -82.7485 }, density: 1.2, chosen: false };
const d50 = { illuminant: 'D50', observer: '2' as const, geometry: '45/0', condition: 'M0' as const };

function values(): SessionFormValues {
  const v = emptySessionValues([SPOT_ID, SPOT2_ID], null, '2025-02-01');
  return { ...v, instrument: 'Handheld spectro S-1', geometry: '45/0' };
}

describe('live preview of a spot', () => {
  it('gives CIEDE2000 against the baseline (Sharma, Wu & Dalal 2005, Table 1, pair 1: 2.0425)', () => {
    const entry = { ...values().spots[SPOT_ID]! };
    entry.readings = [{ L: '50', a: '2.6772', b: '-79.7751' }];
    const preview = previewSpot(entry, baseline, makeSession(), d50, 2);
    if (preview.kind !== 'readings' || preview.against.kind !== 'compared') throw new Error('expected a comparison');
    expect(preview.against.dE00).toBeCloseTo(2.0425, 4);
    expect(preview.against.atOrBeyondThreshold).toBe(true);
  });

  it('refuses to compare readings taken under other conditions, with the reason', () => {
    const entry = { ...values().spots[SPOT_ID]!, readings: [{ L: '50', a: '2.6772', b: '-79.7751' }] };
    const preview = previewSpot(entry, baseline, makeSession(), { ...d50, illuminant: 'D65' }, 2);
    expect(preview.kind === 'readings' && preview.against).toEqual({
      kind: 'not_comparable',
      reason: 'Baseline measured under D50/2°, this session under D65/2°: not comparable without conversion',
    });
  });

  it('averages several readings and leaves out half-typed rows', () => {
    const entry = {
      ...values().spots[SPOT_ID]!,
      readings: [
        { L: '50', a: '1', b: '-80' },
        { L: '52', a: '3', b: '-82' },
        { L: '51', a: '', b: '' },
      ],
    };
    const preview = previewSpot(entry, null, null, d50, 2);
    if (preview.kind !== 'readings') throw new Error('expected readings');
    expect(preview.summary.n).toBe(2);
    expect(preview.summary.mean).toEqual({ L: 51, a: 2, b: -81 });
    expect(preview.summary.sd?.L).toBeCloseTo(Math.SQRT2, 10);
    expect(preview.against).toEqual({ kind: 'no_baseline' });
  });
});

describe('checking a session', () => {
  it('sends only spots with readings, with blank rows left out, and says which rows were sent', () => {
    const v = values();
    v.spots[SPOT2_ID] = { ...v.spots[SPOT2_ID]!, readings: [{ L: '', a: '', b: '' }, { L: '40', a: '1', b: '2' }] };
    const checked = checkSession(v, [SPOT_ID, SPOT2_ID]);
    if (!checked.ok) throw new Error(JSON.stringify(checked.errors));
    expect(checked.data.readings).toEqual([{ spotId: SPOT2_ID, readings: [{ L: 40, a: 1, b: 2 }], density: null, densityType: null, reflectance: null }]);
    expect(checked.order).toEqual([{ spotId: SPOT2_ID, rows: [1] }]);
  });

  it('never turns an empty box into zero', () => {
    const v = values();
    v.spots[SPOT_ID] = { ...v.spots[SPOT_ID]!, readings: [{ L: '50', a: '', b: '-3' }] };
    const checked = checkSession(v, [SPOT_ID, SPOT2_ID]);
    expect(checked.ok).toBe(false);
    if (!checked.ok) expect(checked.errors[`spots.${SPOT_ID}.readings.0.a`]).toBe('a* must be a number');
  });

  it('maps the server’s paths to the row and spot they came from', () => {
    // Spot 1 sent its form rows 0 and 2 (row 1 was left empty); spot 2 sent its row 4.
    const order = [{ spotId: SPOT_ID, rows: [0, 2] }, { spotId: SPOT2_ID, rows: [4] }];
    expect(errorKey('measuredOn', order)).toBe('measuredOn');
    expect(errorKey('readings.0.readings.1.L', order)).toBe(`spots.${SPOT_ID}.readings.2.L`);
    expect(errorKey('readings.1.density', order)).toBe(`spots.${SPOT2_ID}.density`);
    expect(errorKey('readings.1.spotId', order)).toBe(`spots.${SPOT2_ID}`);
    expect(errorKey('readings', order)).toBe('spots');
  });
});
