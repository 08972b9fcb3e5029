import type { Writable } from 'node:stream';
import { finished } from 'node:stream/promises';
import yazl from 'yazl';
import { COHORT_FACTORS, COHORT_FACTOR_CODES, type CohortFactorCode } from '@toneledger/common/fields/cohort';
import type { CohortQuery } from '@toneledger/common/schemas/research';
import { db } from '../db';
import { recordAudit } from './audit.service';
import { loadCohort, runCohort } from './cohort.service';
import { toCsv, type CsvCell } from './csv-cells';

/**
 * The export of a cohort query as a Frictionless Data Package (tabular-data-package profile) in a
 * zip, streamed: `datapackage.json` with a Table Schema per tabular resource (`cohort.csv`,
 * `cohort.json`, `survival.csv`, `fading.csv`), plus `query.json` (the query as run, also under the
 * package's `query` property) and `README.md`. Every factor column comes from `COHORT_FACTORS`
 * (title, description, unit as a custom `unit` property and in the description). Text cells follow
 * the CSV cell rule (`csv-cells.ts`). Audited as `research.exported` with the query and row count.
 */

interface TableField { name: string; type: 'string' | 'number' | 'integer' | 'boolean'; title: string; description: string; unit?: string; format?: string; constraints?: { enum?: string[]; required?: boolean } }

const FACTOR_TYPE = (code: CohortFactorCode): TableField['type'] => {
  const k = COHORT_FACTORS[code].kind;
  return k === 'number' ? 'number' : k === 'year' ? 'integer' : 'string';
};

/** The factor columns of cohort.csv: every factor, in the table's order. */
export function factorFields(): TableField[] {
  return COHORT_FACTOR_CODES.map((code) => {
    const f = COHORT_FACTORS[code] as { label: string; kind: string; unit?: string; description: string; choices?: { codes: readonly string[] } };
    const field: TableField = { name: code, type: FACTOR_TYPE(code), title: f.label, description: f.unit ? `${f.description} Unit: ${f.unit}.` : f.description };
    if (f.unit) field.unit = f.unit;
    if (f.kind === 'place') { field.format = 'uuid'; field.description += ' The id of the place (Locations).'; }
    if (f.kind === 'year') field.description = `${f.description} The earliest year.`;
    if (f.choices) field.constraints = { enum: [...f.choices.codes] };
    if (f.kind === 'flag') field.constraints = { enum: ['yes', 'no', 'unknown'] };
    return field;
  });
}

export const OUTCOME_FIELDS: TableField[] = [
  { name: 'delta_e00_per_year', type: 'number', title: 'Fading rate', unit: 'ΔE00/year', description: 'ΔE00 per year at the maximum-density spot, fitted against the baseline (Measurements). Unit: ΔE00/year.' },
  { name: 'density_loss_per_year', type: 'number', title: 'Density loss rate', unit: '%/year', description: 'Density lost per year at the maximum-density spot, in % of the baseline density. Unit: %/year.' },
  { name: 'time_years', type: 'number', title: 'Time', unit: 'year', description: 'Years from the origin to the event or to the last observation; empty when the print does not count for survival. Unit: year.' },
  { name: 'event', type: 'boolean', title: 'Event', description: 'True when the event happened; false when the print was censored at time_years.' },
];

const COHORT_FIELDS: TableField[] = [
  { name: 'print_id', type: 'string', format: 'uuid', title: 'Print id', description: "The print's id in this collection.", constraints: { required: true } },
  { name: 'accession_number', type: 'string', title: 'Accession number', description: "The print's accession number.", constraints: { required: true } },
  { name: 'title', type: 'string', title: 'Title', description: "The print's title." },
  { name: 'group', type: 'string', title: 'Group', description: 'The key of the group the print falls in for this query.' },
  ...factorFields(),
  ...OUTCOME_FIELDS,
];

const SURVIVAL_FIELDS: TableField[] = [
  { name: 'group', type: 'string', title: 'Group', description: 'The group key.' },
  { name: 't', type: 'number', title: 'Time', unit: 'year', description: 'Years from the origin. Unit: year.' },
  { name: 'at_risk', type: 'integer', title: 'At risk', description: 'Prints at risk just before t.' },
  { name: 'events', type: 'integer', title: 'Events', description: 'Events at t.' },
  { name: 'censored', type: 'integer', title: 'Censored', description: 'Prints censored at t.' },
  { name: 's', type: 'number', title: 'Survival', description: 'Kaplan–Meier estimate S(t).' },
  { name: 'se', type: 'number', title: 'Standard error', description: 'Greenwood standard error of S(t).' },
  { name: 'lower', type: 'number', title: 'Lower 95 % limit', description: 'Lower limit of the 95 % interval of S(t).' },
  { name: 'upper', type: 'number', title: 'Upper 95 % limit', description: 'Upper limit of the 95 % interval of S(t).' },
];

const FADING_FIELDS: TableField[] = [
  { name: 'group', type: 'string', title: 'Group', description: 'The group key.' },
  { name: 'print_id', type: 'string', format: 'uuid', title: 'Print id', description: "The print's id." },
  { name: 'accession_number', type: 'string', title: 'Accession number', description: "The print's accession number." },
  { name: 'measure', type: 'string', title: 'Measure', description: 'delta_e00_per_year or density_loss_per_year.', constraints: { enum: ['delta_e00_per_year', 'density_loss_per_year'] } },
  { name: 'value', type: 'number', title: 'Value', description: 'The rate: ΔE00/year or %/year.' },
];

const resource = (name: string, path: string, fields: TableField[], format: 'csv' | 'json') => ({
  name, path, profile: 'tabular-data-resource', format, mediatype: format === 'csv' ? 'text/csv' : 'application/json', encoding: 'utf-8', schema: { fields },
});

function readme(q: CohortQuery, rows: number, created: string): string {
  return `# Cohort export

Made ${created} by Toneledger from a cohort query of ${rows} rows (one per print; a print toned with two toner classes has a row per class when the query groups by toner class).

Files:

- \`datapackage.json\`: the Frictionless Data Package descriptor (tabular-data-package): each table's columns with type, title, description and unit.
- \`cohort.csv\` and \`cohort.json\`: the prints of the cohort with every factor and their outcomes (the same rows).
- \`survival.csv\`: the Kaplan–Meier steps per group.
- \`fading.csv\`: the fading rates behind the strip plots, per group.
- \`query.json\`: the query as run.

CSV files are UTF-8 with a header row. A text cell that a spreadsheet would run as a formula (starting with =, +, -, @) is written with a leading apostrophe.
`;
}

/** Writes the package to `out` (the zip is streamed). Returns the number of cohort rows. */
export async function writeCohortPackage(q: CohortQuery, actor: { id: string; name: string | null }, requestId: string | null, out: Writable): Promise<number> {
  const figures = await runCohort(q, { pointsCap: null });
  const everyFactor: CohortQuery = { ...q, coxFactors: [...COHORT_FACTOR_CODES] };
  const { rows } = await loadCohort(everyFactor, { ordered: true });
  const created = new Date().toISOString();
  await db().transaction((t) => recordAudit({ actor, action: 'research.exported', entityType: 'research_query', entityId: null, after: { query: q, rows: rows.length }, requestId }, t));

  const factorCells = (x: (string | number | null)[] | null) => COHORT_FACTOR_CODES.map((code, i): CsvCell => {
    const v = x?.[i] ?? null;
    if (v === null) return null;
    const type = FACTOR_TYPE(code);
    return type === 'number' || type === 'integer' ? Number(v) : String(v);
  });
  const cohortRows = rows.map((r) => [r.id, r.accession_number, r.title, r.key, ...factorCells(r.x), r.de_per_year, r.density_loss_per_year, r.time, r.event === null ? null : String(r.event)] as CsvCell[]);
  const names = COHORT_FIELDS.map((f) => f.name);
  const json = cohortRows.map((cells) => Object.fromEntries(names.map((n, i) => [n, n === 'event' ? (cells[i] === null ? null : cells[i] === 'true') : cells[i] ?? null])));
  const survival: CsvCell[][] = figures.survival.groups.flatMap((g) => g.steps.map((s) => [g.key, s.t, s.atRisk, s.events, s.censored, s.s, s.se, s.lower, s.upper]));
  const fading: CsvCell[][] = figures.fading.flatMap((g) => [
    ...g.deltaEPerYear.points.map((p) => [g.key, p.printId, p.accessionNumber, 'delta_e00_per_year', p.value]),
    ...g.densityLossPerYear.points.map((p) => [g.key, p.printId, p.accessionNumber, 'density_loss_per_year', p.value]),
  ]);
  const descriptor = {
    profile: 'tabular-data-package',
    name: `toneledger-cohort-${created.slice(0, 10)}`,
    title: 'Cohort of toned prints: factors and outcomes',
    created,
    query: q,
    resources: [
      resource('cohort', 'cohort.csv', COHORT_FIELDS, 'csv'),
      resource('cohort-json', 'cohort.json', COHORT_FIELDS, 'json'),
      resource('survival', 'survival.csv', SURVIVAL_FIELDS, 'csv'),
      resource('fading', 'fading.csv', FADING_FIELDS, 'csv'),
    ],
  };

  const zip = new yazl.ZipFile();
  const add = (name: string, text: string) => zip.addBuffer(Buffer.from(text, 'utf8'), name, { mtime: new Date(created) });
  add('datapackage.json', `${JSON.stringify(descriptor, null, 2)}\n`);
  add('cohort.csv', toCsv([names, ...cohortRows]));
  add('cohort.json', `${JSON.stringify(json)}\n`);
  add('survival.csv', toCsv([SURVIVAL_FIELDS.map((f) => f.name), ...survival]));
  add('fading.csv', toCsv([FADING_FIELDS.map((f) => f.name), ...fading]));
  add('query.json', `${JSON.stringify(q, null, 2)}\n`);
  add('README.md', readme(q, rows.length, created));
  zip.outputStream.pipe(out);
  zip.end();
  await finished(zip.outputStream);
  return rows.length;
}
