import { PAPER_BASE, PROCESS, SUPPORT, TONER_CLASS, TONING_EXTENT } from '../schemas/vocab';

/**
 * The factors of a print a researcher can filter, group and model by: listed once here, read by the
 * query builder, the server's SQL (one column or expression per factor, `backend/src/services/cohort-*.ts`),
 * the Cox model's covariates and the exported data dictionary. Each has a kind:
 * - choice: one code of a vocabulary (filter: any of the chosen codes; group: by code);
 * - text: a free value such as a paper's surface (filter: any of the chosen values; group: by value);
 * - flag: yes / no / unknown (filter and group by it);
 * - number: a measured quantity with a unit (filter: a range; group: by the bands given in the query, or the median split);
 * - place: a location and everything inside it (filter only; group by the top two levels below it);
 * - year: the date made as an EDTF range (filter: overlap with a range of years; group: by decade).
 */
export type FactorKind = 'choice' | 'text' | 'flag' | 'number' | 'place' | 'year';

export interface CohortFactor {
  label: string;
  kind: FactorKind;
  /** The vocabulary of a choice factor. */
  choices?: { codes: readonly string[]; labels: Record<string, string> };
  unit?: string;
  /** What the value means and where in the app it comes from (the data dictionary's words). */
  description: string;
}

const vocab = (v: { codes: readonly string[]; labels: Record<string, string> }) => ({ codes: v.codes, labels: v.labels });

export const COHORT_FACTORS = {
  process: { label: 'Process', kind: 'choice', choices: vocab(PROCESS), description: "The print's process, from its catalogue record." },
  support: { label: 'Support', kind: 'choice', choices: vocab(SUPPORT), description: "The print's support, from its catalogue record." },
  paperBase: { label: 'Paper base', kind: 'choice', choices: vocab(PAPER_BASE), description: "The base of the print's paper (Papers)." },
  paperSurface: { label: 'Paper surface', kind: 'text', description: "The surface of the print's paper as recorded (Papers)." },
  paperTint: { label: 'Paper base tint', kind: 'text', description: "The base tint of the print's paper as recorded (Papers)." },
  tonerClass: { label: 'Toner', kind: 'choice', choices: vocab(TONER_CLASS), description: 'A class of toner used in any toning step of the process history; a print toned twice belongs to both. "Untoned" is the flag below.' },
  toned: { label: 'Toned', kind: 'flag', description: 'Whether the process history holds any toning step.' },
  tonerSequence: { label: 'Toner sequence', kind: 'text', description: 'The toner classes in the order of the toning steps, e.g. "selenium → iron_blue".' },
  ferricyanideGL: { label: 'Ferricyanide in the toner', kind: 'number', unit: 'g/L', description: 'Potassium ferricyanide per litre of working toner, from the toning step\'s recipe and dilution (Bath recipes).' },
  acidGL: { label: 'Acid in the toner', kind: 'number', unit: 'g/L', description: 'Acid per litre of working toner, from the toning step\'s recipe and dilution (Bath recipes).' },
  toningMinutes: { label: 'Toning time', kind: 'number', unit: 'min', description: 'Total time of the toning steps.' },
  toningExtent: { label: 'Toning extent', kind: 'choice', choices: vocab(TONING_EXTENT), description: 'The extent recorded on the (first) toning step.' },
  washingMinutes: { label: 'Washing time', kind: 'number', unit: 'min', description: 'Total time of the washing and final-wash steps.' },
  hypoClearing: { label: 'Hypo clearing', kind: 'flag', description: 'Whether the process history holds a hypo-clearing step.' },
  alkalineAfterBath: { label: 'Alkaline after-bath', kind: 'flag', description: 'Whether an after-bath was alkaline (e.g. borax), as recorded on the after-bath step.' },
  enclosureType: { label: 'Enclosure type', kind: 'text', description: "The name of the print's current enclosure type (Enclosures)." },
  enclosureBuffered: { label: 'Buffered enclosure', kind: 'flag', description: "Whether the print's current enclosure is alkaline-buffered (Enclosures)." },
  location: { label: 'Storage place', kind: 'place', description: "The print's current place and everything inside it (Locations)." },
  climatePermanence: { label: 'Store permanence', kind: 'number', unit: '×', description: 'Relative permanence of the current store over the last 365 days (isoperm model, Climate); none without logger readings.' },
  lightBand: { label: 'Light dose', kind: 'choice', choices: { codes: ['none', 'within', 'over'], labels: { none: 'Never displayed', within: 'Within budget', over: 'Over budget' } }, description: "The print's light exposure against its budget (Light dose)." },
  dateMade: { label: 'Date made', kind: 'year', unit: 'year', description: "The print's date made (EDTF), as the range of years it may fall in." },
  maker: { label: 'Maker', kind: 'text', description: "The print's maker (Makers)." },
} as const satisfies Record<string, CohortFactor>;

export type CohortFactorCode = keyof typeof COHORT_FACTORS;
export const COHORT_FACTOR_CODES = Object.keys(COHORT_FACTORS) as CohortFactorCode[];
