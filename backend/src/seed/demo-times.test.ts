import { describe, expect, it } from 'vitest';
import { copySetupFor, signedAtFor } from './demo-times';

describe('the demo history is consistent in time', () => {
  it('signs a report a few days after its examination, never on the day the seed runs', () => {
    const now = new Date('2026-12-02T10:00:00Z');
    const at = signedAtFor('1993-05-04', (min) => min + 2, now);
    expect(at.toISOString()).toBe('1993-05-07T16:00:00.000Z');
    // A report examined yesterday cannot be signed in the future.
    expect(signedAtFor('2026-12-01', (_min, max) => max, now)).toEqual(now);
  });

  it('gives a 1993 photograph the EXIF of a film scanner, not of a digital back (digital capture began in the mid-1990s, common practice)', () => {
    const setup = copySetupFor('1993-05-04');
    expect(setup.model).toMatch(/film scanner/);
    expect(setup.description).toMatch(/Copy negative/);
    expect(copySetupFor('1999-01-01').model).toMatch(/scanning back/);
    expect(copySetupFor('2024-03-11').model).toMatch(/reproduction camera/);
  });
});
