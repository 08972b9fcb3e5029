/**
 * Compatibility warnings computed from a print record: enclosure and after-bath rules for
 * prints that carry iron blue (Prussian blue) — cyanotypes and iron-blue toned prints — and the
 * Photographic Activity Test status of any enclosure.
 *
 * The product advises; care decisions rest with qualified conservators.
 */

export interface CompatibilityInput {
  /** 'gelatin_silver_developing_out' | 'gelatin_silver_printing_out' | 'cyanotype' | 'albumen' | 'platinum_palladium' | 'other' */
  process: string;
  /** From toning steps: 'selenium' | 'gold' | 'sulfide' | 'polysulfide' | 'iron_blue' | 'copper' | 'vanadium' | 'other' */
  tonerClasses: string[];
  afterBaths: { solution: string; alkaline?: boolean | null }[];
  enclosure: { name: string; alkalineBuffered: boolean | null; patResult: 'passed' | 'failed' | 'not_tested' | null } | null;
}

export type CompatibilityCode =
  | 'prussian_blue_in_buffered_enclosure'
  | 'enclosure_without_pat'
  | 'enclosure_failed_pat'
  | 'alkaline_after_bath_on_iron_blue'
  | 'buffering_unknown_for_prussian_blue'
  | 'over_light_budget';

export interface CompatibilityWarning {
  code: CompatibilityCode;
  severity: 'high' | 'medium' | 'low';
  /** Plain and specific, for a registrar. */
  message: string;
  /** Where the rule comes from. */
  basis: string;
}

// Sources as listed in the project's reference notes (§5 Storage and enclosures).
const ALKALI_BASIS =
  'Cyanotypes fade under alkaline conditions, so alkaline-buffered enclosures should not be used ' +
  '(J. M. Reilly, Care and Identification of 19th-Century Photographic Prints, 1986; M. Ware, "A Blueprint for ' +
  'Conserving Cyanotypes", Topics in Photographic Preservation 10, 2003); the same rule is applied to iron-blue ' +
  'toned prints, which carry the same pigment, as common practice.';
// ISO 18902 → ISO 18916 PAT requirement: from memory (not re-read in the standard).
const PAT_BASIS =
  'ISO 18902 (enclosures for processed photographic materials) asks that enclosure materials pass the ' +
  'Photographic Activity Test of ISO 18916.';
const AFTER_BATH_BASIS =
  'Iron blue is destroyed by alkali (J. M. Reilly 1986; M. Ware 2003, on cyanotypes); that a dilute borax bath ' +
  'shifts iron blue toward grey or lilac, and is sometimes used on purpose, is common practice.';

const ALKALINE_NAMES =
  /borax|tetraborate|metaborate|sodium carbonate|potassium carbonate|washing soda|bicarbonate|ammonia|ammonium hydroxide|sodium hydroxide|potassium hydroxide|caustic soda/i;

/** Does the solution's name identify a common alkaline bath (borax, carbonate, ammonia, hydroxide, …)? */
export function isAlkalineSolution(name: string): boolean {
  return ALKALINE_NAMES.test(name);
}

/** Does the print carry iron blue (Prussian blue): a cyanotype, or any iron-blue toning step? */
export function isPrussianBlue(input: Pick<CompatibilityInput, 'process' | 'tonerClasses'>): boolean {
  return input.process === 'cyanotype' || input.tonerClasses.includes('iron_blue');
}

function whatItIs(input: CompatibilityInput): string {
  return input.process === 'cyanotype' ? 'This cyanotype' : 'This iron-blue toned print';
}

const SEVERITY_ORDER = { high: 0, medium: 1, low: 2 } as const;

/** All warnings for one print record, most severe first. */
/**
 * The light warning: stored on the print by the server's light service when its display periods,
 * as recorded (past and scheduled), take it past its light budget (over the annual exposure in any
 * 12 months, or brighter than its category's maximum in a display not yet ended); its figures need
 * the display periods, so it is not computed from the record here.
 */
export const OVER_LIGHT_BUDGET_WARNING: CompatibilityWarning = {
  code: 'over_light_budget',
  severity: 'high',
  message: 'On display past its light budget: its displays, as planned, exceed the annual exposure or the maximum illuminance of its light category. Staff see the figures and the rest owed in the light dose of the print.',
  basis: 'Light budgets per light-responsivity category (CIE 157:2004; REFERENCES.md §4), as set in the light settings.',
};

export function compatibilityWarnings(input: CompatibilityInput): CompatibilityWarning[] {
  const out: CompatibilityWarning[] = [];
  const blue = isPrussianBlue(input);
  const enc = input.enclosure;

  if (enc && blue) {
    if (enc.alkalineBuffered === true) {
      out.push({
        code: 'prussian_blue_in_buffered_enclosure',
        severity: 'high',
        message:
          `${whatItIs(input)} is in an alkaline-buffered enclosure ("${enc.name}"). Its blue pigment fades under ` +
          'alkaline conditions: move it to an unbuffered enclosure that has passed the Photographic Activity Test.',
        basis: ALKALI_BASIS,
      });
    } else if (enc.alkalineBuffered === null) {
      out.push({
        code: 'buffering_unknown_for_prussian_blue',
        severity: 'medium',
        message:
          `${whatItIs(input)} is in an enclosure ("${enc.name}") whose buffering is not recorded. Its blue pigment ` +
          'fades under alkaline conditions: find out whether the enclosure is alkaline-buffered and record it.',
        basis: ALKALI_BASIS,
      });
    }
  }

  if (enc) {
    if (enc.patResult === 'failed') {
      out.push({
        code: 'enclosure_failed_pat',
        severity: 'high',
        message: `The enclosure "${enc.name}" failed the Photographic Activity Test: replace it with one that passed.`,
        basis: PAT_BASIS,
      });
    } else if (enc.patResult === null || enc.patResult === 'not_tested') {
      out.push({
        code: 'enclosure_without_pat',
        severity: 'low',
        message:
          `The enclosure "${enc.name}" has no Photographic Activity Test result on record. ` +
          'Record the result, or use an enclosure that has passed the test.',
        basis: PAT_BASIS,
      });
    }
  }

  if (blue) {
    // An explicit alkaline flag wins; only when it is unknown is the solution's name used.
    const alkaline = input.afterBaths.filter((b) => (b.alkaline == null ? isAlkalineSolution(b.solution) : b.alkaline));
    if (alkaline.length > 0) {
      const names = alkaline.map((b) => `"${b.solution}"`).join(', ');
      out.push({
        code: 'alkaline_after_bath_on_iron_blue',
        severity: 'medium',
        message:
          `${whatItIs(input)} had an alkaline after-bath (${names}). The blue pigment is sensitive to alkali: a dilute ` +
          'borax bath, for example, shifts iron blue toward grey or lilac. This is sometimes done on purpose, but the ' +
          'record of it matters for care: keep the print away from further alkali (cleaning, buffered enclosures).',
        basis: AFTER_BATH_BASIS,
      });
    }
  }

  // Stable sort: within one severity the order above is kept.
  return out.sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity]);
}
