import { describe, expect, it } from 'vitest';
import { compatibilityWarnings, isAlkalineSolution, isPrussianBlue, type CompatibilityInput } from './compatibility';

const safeEnclosure = { name: 'Unbuffered paper folder', alkalineBuffered: false, patResult: 'passed' as const };
const bufferedEnclosure = { name: 'Buffered box', alkalineBuffered: true, patResult: 'passed' as const };

function print(over: Partial<CompatibilityInput>): CompatibilityInput {
  return { process: 'gelatin_silver_developing_out', tonerClasses: [], afterBaths: [], enclosure: safeEnclosure, ...over };
}
const codes = (i: CompatibilityInput) => compatibilityWarnings(i).map((w) => [w.code, w.severity]);

describe('iron blue in alkaline-buffered enclosures', () => {
  // Reilly 1986 and Ware 2003: cyanotypes fade under alkaline conditions, so no alkaline-buffered
  // enclosures (REFERENCES.md §5, published); applied to iron-blue toned prints as common practice.
  it('an iron-blue toned print in a buffered enclosure is high', () => {
    const w = compatibilityWarnings(print({ tonerClasses: ['selenium', 'iron_blue'], enclosure: bufferedEnclosure }));
    expect(w.map((x) => [x.code, x.severity])).toEqual([['prussian_blue_in_buffered_enclosure', 'high']]);
    expect(w[0].message).toMatch(/iron-blue toned print/);
    expect(w[0].message).toMatch(/"Buffered box"/);
    expect(w[0].basis).toMatch(/Reilly.*1986/);
    expect(w[0].basis).toMatch(/Ware.*2003/);
    expect(w[0].basis).toMatch(/common practice/);
  });

  it('a cyanotype in a buffered enclosure is high (Reilly 1986; Ware 2003)', () => {
    const w = compatibilityWarnings(print({ process: 'cyanotype', enclosure: bufferedEnclosure }));
    expect(w.map((x) => x.code)).toEqual(['prussian_blue_in_buffered_enclosure']);
    expect(w[0].message).toMatch(/^This cyanotype/);
  });

  it('buffering not recorded is medium; unbuffered gives nothing', () => {
    const unknown = { ...safeEnclosure, alkalineBuffered: null };
    expect(codes(print({ tonerClasses: ['iron_blue'], enclosure: unknown }))).toEqual([['buffering_unknown_for_prussian_blue', 'medium']]);
    expect(codes(print({ tonerClasses: ['iron_blue'] }))).toEqual([]);
  });

  it('a selenium or sulfide toned print in a buffered enclosure is not warned about', () => {
    expect(codes(print({ tonerClasses: ['selenium', 'sulfide'], enclosure: bufferedEnclosure }))).toEqual([]);
    expect(codes(print({ tonerClasses: ['gold'], enclosure: { ...bufferedEnclosure, alkalineBuffered: null } }))).toEqual([]);
  });

  it('no enclosure on record gives no enclosure warning', () => {
    expect(codes(print({ tonerClasses: ['iron_blue'], enclosure: null }))).toEqual([]);
  });
});

describe('Photographic Activity Test (ISO 18902 / ISO 18916; from memory per REFERENCES.md §5)', () => {
  it('no result or not tested is low; failed is high; passed is nothing', () => {
    expect(codes(print({ enclosure: { ...safeEnclosure, patResult: null } }))).toEqual([['enclosure_without_pat', 'low']]);
    expect(codes(print({ enclosure: { ...safeEnclosure, patResult: 'not_tested' } }))).toEqual([['enclosure_without_pat', 'low']]);
    expect(codes(print({ enclosure: { ...safeEnclosure, patResult: 'failed' } }))).toEqual([['enclosure_failed_pat', 'high']]);
    expect(codes(print({}))).toEqual([]);
    const [w] = compatibilityWarnings(print({ enclosure: { ...safeEnclosure, patResult: 'failed' } }));
    expect(w.basis).toMatch(/ISO 18902/);
    expect(w.basis).toMatch(/ISO 18916/);
  });
});

describe('alkaline after-baths on iron blue', () => {
  // Alkali sensitivity: Reilly 1986; Ware 2003 (published). The borax shift toward grey/lilac
  // and its deliberate use: common practice.
  it('a dilute borax after-bath on an iron-blue toned print is medium and says why', () => {
    const w = compatibilityWarnings(print({ tonerClasses: ['iron_blue'], afterBaths: [{ solution: 'Borax 1 %' }] }));
    expect(w.map((x) => [x.code, x.severity])).toEqual([['alkaline_after_bath_on_iron_blue', 'medium']]);
    expect(w[0].message).toMatch(/"Borax 1 %"/);
    expect(w[0].message).toMatch(/grey or lilac/);
    expect(w[0].message).toMatch(/on purpose/);
    expect(w[0].basis).toMatch(/common practice/);
  });

  it('the explicit flag wins over the name', () => {
    const flagged = print({ tonerClasses: ['iron_blue'], afterBaths: [{ solution: 'House after-bath B', alkaline: true }] });
    expect(codes(flagged)).toEqual([['alkaline_after_bath_on_iron_blue', 'medium']]);
    const cleared = print({ tonerClasses: ['iron_blue'], afterBaths: [{ solution: 'Borax, neutralised', alkaline: false }] });
    expect(codes(cleared)).toEqual([]);
  });

  it('an acid or neutral after-bath, or borax on a selenium print, gives nothing', () => {
    expect(codes(print({ tonerClasses: ['iron_blue'], afterBaths: [{ solution: 'Dilute acetic acid', alkaline: null }] }))).toEqual([]);
    expect(codes(print({ tonerClasses: ['selenium'], afterBaths: [{ solution: 'Borax 1 %' }] }))).toEqual([]);
  });

  it('several alkaline baths make one warning naming all of them', () => {
    const w = compatibilityWarnings(
      print({ process: 'cyanotype', afterBaths: [{ solution: 'Sodium carbonate' }, { solution: 'Water' }, { solution: 'Ammonia, weak' }] }),
    );
    expect(w).toHaveLength(1);
    expect(w[0].message).toMatch(/"Sodium carbonate", "Ammonia, weak"/);
  });
});

describe('several rules at once', () => {
  it('are ordered high, medium, low', () => {
    const w = compatibilityWarnings({
      process: 'gelatin_silver_developing_out',
      tonerClasses: ['iron_blue'],
      afterBaths: [{ solution: 'sodium metaborate' }],
      enclosure: { name: 'Old box', alkalineBuffered: true, patResult: 'not_tested' },
    });
    expect(w.map((x) => [x.code, x.severity])).toEqual([
      ['prussian_blue_in_buffered_enclosure', 'high'],
      ['alkaline_after_bath_on_iron_blue', 'medium'],
      ['enclosure_without_pat', 'low'],
    ]);
  });
});

describe('helpers', () => {
  it('isPrussianBlue: cyanotypes and iron-blue toning', () => {
    expect(isPrussianBlue({ process: 'cyanotype', tonerClasses: [] })).toBe(true);
    expect(isPrussianBlue({ process: 'gelatin_silver_developing_out', tonerClasses: ['iron_blue'] })).toBe(true);
    expect(isPrussianBlue({ process: 'gelatin_silver_developing_out', tonerClasses: ['copper', 'vanadium'] })).toBe(false);
  });

  it('isAlkalineSolution: common alkaline bath names (common practice), case-insensitive', () => {
    for (const n of ['Borax 1 %', 'SODIUM CARBONATE', 'Sodium bicarbonate', 'Ammonia', 'sodium hydroxide', 'Sodium metaborate']) {
      expect(isAlkalineSolution(n), n).toBe(true);
    }
    // Ammonium salts are not ammonia; acids and plain water are not alkaline.
    for (const n of ['Ferric ammonium citrate', 'Acetic acid 2 %', 'Water']) {
      expect(isAlkalineSolution(n), n).toBe(false);
    }
  });
});
