import type { CsvMapping } from '@/features/measurements/api/preview-csv';

export type MappingField = 'spot' | 'L' | 'a' | 'b' | 'density' | 'reflectance';

export const MAPPING_LABELS: Record<MappingField, string> = {
  spot: 'Spot column',
  L: 'L* column',
  a: 'a* column',
  b: 'b* column',
  density: 'Density column',
  reflectance: 'Reflectance column',
};

export const REQUIRED_MAPPING: MappingField[] = ['spot', 'L', 'a', 'b'];
export const OPTIONAL_MAPPING: MappingField[] = ['density', 'reflectance'];

/** A header reduced to letters and digits: "CIE L*" → "ciel", "Lab_a" → "laba", "Spot name" → "spotname". */
function norm(header: string): string {
  return header.toLowerCase().replace(/[^a-z0-9%]/g, '');
}

/** For each field, tests from the surest to the loosest: a header that names the spot wins over one that only might. */
const GUESSES: Record<MappingField, ((h: string) => boolean)[]> = {
  spot: [(h) => h.startsWith('spot'), (h) => ['location', 'patch', 'area', 'samplename', 'sample', 'name'].includes(h)],
  L: [(h) => ['l', 'ciel', 'labl', 'lstar', 'lightness'].includes(h)],
  a: [(h) => ['a', 'ciea', 'laba', 'astar'].includes(h)],
  b: [(h) => ['b', 'cieb', 'labb', 'bstar'].includes(h)],
  density: [(h) => h.startsWith('dens') || ['d', 'dv', 'dvis', 'visualdensity', 'od'].includes(h)],
  reflectance: [(h) => h.startsWith('reflect') || ['r', 'r%', 'y'].includes(h)],
};

export type MappingValues = Record<MappingField, string> & { reflectanceIsPercent: boolean };

/** A first choice of column for each field, from the header names ("L*", "a*", "b*", "Spot"…); '' when none fits. */
export function guessMapping(columns: string[]): MappingValues {
  const taken = new Set<string>();
  const pick = (field: MappingField) => {
    let found: string | undefined;
    for (const test of GUESSES[field]) {
      found = columns.find((c) => !taken.has(c) && test(norm(c)));
      if (found) break;
    }
    if (found) taken.add(found);
    return found ?? '';
  };
  const spot = pick('spot');
  const L = pick('L');
  const a = pick('a');
  const b = pick('b');
  const density = pick('density');
  const reflectance = pick('reflectance');
  return { spot, L, a, b, density, reflectance, reflectanceIsPercent: reflectance !== '' && reflectance.includes('%') };
}

/** The mapping as the server takes it: optional columns left out when not chosen. */
export function toCsvMapping(values: MappingValues): CsvMapping {
  return {
    spot: values.spot,
    L: values.L,
    a: values.a,
    b: values.b,
    ...(values.density ? { density: values.density } : {}),
    ...(values.reflectance ? { reflectance: values.reflectance, reflectanceIsPercent: values.reflectanceIsPercent } : {}),
  };
}
