import { describe, expect, it } from 'vitest';
import { guessMapping, toCsvMapping } from '@/features/measurements/utils/csv-mapping';

describe('guessing the CSV columns', () => {
  it('reads the usual header spellings', () => {
    expect(guessMapping(['Sample', 'Spot name', 'CIE L*', 'CIE a*', 'CIE b*', 'R%'])).toEqual({
      spot: 'Spot name', L: 'CIE L*', a: 'CIE a*', b: 'CIE b*', density: '', reflectance: 'R%', reflectanceIsPercent: true,
    });
    expect(guessMapping(['Patch', 'Lab_L', 'Lab_a', 'Lab_b', 'Density'])).toMatchObject({ spot: 'Patch', L: 'Lab_L', a: 'Lab_a', b: 'Lab_b', density: 'Density' });
  });

  it('leaves a field unchosen when no header fits', () => {
    expect(guessMapping(['when', 'value'])).toEqual({ spot: '', L: '', a: '', b: '', density: '', reflectance: '', reflectanceIsPercent: false });
  });

  it('leaves unchosen optional columns out of the mapping it sends', () => {
    expect(toCsvMapping({ spot: 'S', L: 'L', a: 'A', b: 'B', density: '', reflectance: '', reflectanceIsPercent: false })).toEqual({ spot: 'S', L: 'L', a: 'A', b: 'B' });
  });
});
