import { z } from 'zod';
import { printSchema, processStepSchema, movementSchema, makerSchema, paperSchema, recipeSchema, locationSchema, enclosureSchema } from '@toneledger/common/schemas/catalogue';
import { reportSchema, observationSchema, addendumSchema, conditionTermSchema } from '@toneledger/common/schemas/condition';
import { sessionSchema, spotSchema } from '@toneledger/common/schemas/measurements';
import { loanSchema } from '@toneledger/common/schemas/loans';
import { exhibitionSchema } from '@toneledger/common/schemas/exhibitions';
import { imageSchema } from '@toneledger/common/schemas/images';
import { auditEventSchema } from '@toneledger/common/schemas/audit';
import { userSchema } from '@toneledger/common/schemas/users';
import { bagPrintFileSchema } from '@toneledger/common/schemas/preservation';
import type { BagWriter } from './bag-writer';
import type { Schema } from './connection';
import { PRINT_SECTIONS } from './sections';
import { tablesOf, type BagTable } from './section';
import { AUDIT_TABLE, COLLECTION_TABLES, LEFT_OUT_TABLES } from './tables';

/** The product's own record types as its API gives them (the contract's zod schemas). */
const CONTRACT_TYPES: Record<string, z.ZodType> = {
  'print-file': bagPrintFileSchema, print: printSchema, 'process-step': processStepSchema, movement: movementSchema, maker: makerSchema, paper: paperSchema,
  recipe: recipeSchema, location: locationSchema, enclosure: enclosureSchema, 'condition-report': reportSchema, observation: observationSchema,
  addendum: addendumSchema, 'condition-term': conditionTermSchema, 'measurement-session': sessionSchema, 'measurement-spot': spotSchema,
  loan: loanSchema, exhibition: exhibitionSchema, image: imageSchema, 'audit-event': auditEventSchema, user: userSchema,
};

/** A stored column's value in the bag's JSON, as zod describes it (PostgreSQL's JSON output of the type). */
function columnType(pgType: string): z.ZodType {
  if (pgType.endsWith('[]')) return z.array(columnType(pgType.slice(0, -2)));
  switch (pgType) {
    case 'integer': case 'bigint': case 'smallint': case 'int4': case 'int8': case 'int2': return z.number().int();
    case 'numeric': case 'double precision': case 'real': case 'float8': case 'float4': return z.number();
    case 'boolean': case 'bool': return z.boolean();
    case 'jsonb': case 'json': return z.unknown();
    case 'uuid': return z.uuid();
    case 'date': return z.iso.date();
    case 'timestamp with time zone': case 'timestamptz': return z.string().describe('ISO 8601 date and time with offset (UTC), microseconds');
    default: return z.string();
  }
}

/** A JSON Schema per stored record type, generated through zod from the table's columns as the bag writes them. */
export function storedRecordSchema(schema: Schema, table: string, nested: BagTable[] = []): Record<string, unknown> {
  const types = schema.types(table);
  const nullable = schema.nullable(table);
  const shape: Record<string, z.ZodType> = {};
  for (const [col, t] of Object.entries(types)) shape[col] = nullable.has(col) ? columnType(t).nullable() : columnType(t);
  for (const child of nested) shape[child.key] = z.array(z.object({}).loose()).describe(`Rows of ${child.table} (schema ${child.table}.schema.json)`);
  return z.toJSONSchema(z.object(shape).describe(`A row of ${table}`), { unrepresentable: 'any' }) as Record<string, unknown>;
}

/**
 * The data dictionary: `data/dictionary/README.md` (the layout, each file and section in words),
 * `data/dictionary/records/<table>.schema.json` (each stored record type, from its columns through zod)
 * and `data/dictionary/contract/<type>.schema.json` (the product's record types as its API gives them,
 * from the contract's zod schemas), and the CSV columns.
 */
export async function writeDictionary(bag: BagWriter, schema: Schema, csvColumns: string[]): Promise<void> {
  const put = (rel: string, value: unknown) => bag.addPayload(`dictionary/${rel}`, Buffer.from(`${JSON.stringify(value, null, 2)}\n`, 'utf8'));
  const described: string[] = [];
  const sectionTables = PRINT_SECTIONS.flatMap(tablesOf);
  for (const t of [{ table: 'prints', children: [] as BagTable[] }, ...sectionTables, ...COLLECTION_TABLES, { table: AUDIT_TABLE, children: [] }]) {
    if (!schema.has(t.table) || described.includes(t.table)) continue;
    described.push(t.table);
    await put(`records/${t.table}.schema.json`, storedRecordSchema(schema, t.table, 'children' in t ? (t.children ?? []) : []));
  }
  for (const [name, s] of Object.entries(CONTRACT_TYPES)) await put(`contract/${name}.schema.json`, z.toJSONSchema(s, { unrepresentable: 'any', io: 'output' }));
  await bag.addPayload('dictionary/README.md', Buffer.from(readme(schema, csvColumns), 'utf8'));
}

function readme(schema: Schema, csvColumns: string[]): string {
  const section = (t: BagTable, indent = ''): string =>
    `${indent}- \`${t.key}\` — rows of \`${t.table}\`: ${t.description}\n${(t.children ?? []).map((c) => section(c, `${indent}  `)).join('')}`;
  return `# The bag's data dictionary

This bag (BagIt, RFC 8493) holds a photograph collection's records as Toneledger kept them: every
record as JSON, the CSVs a spreadsheet opens, the image files byte for byte, and the audit trail.
Every payload file is listed with its SHA-256 in \`manifest-sha256.txt\`; \`bag-info.txt\` says who made
the bag, when, and which prints it holds.

## Layout (under data/)

- \`prints/<accession number>.json\` — one file per print (an accession number that is not a safe file
  name is written with \`_\` for the unsafe characters and the print's id after \`--\`):
  \`print\` (the stored row) and \`sections\`, one array per kind of record of the print:
${PRINT_SECTIONS.filter((s) => schema.has(s.table)).map((s) => section(s, '  ')).join('')}- \`records/<table>.jsonl\` — records that belong to no single print, one JSON object per line, in an
  order where a row comes after the rows it refers to:
${COLLECTION_TABLES.filter((t) => schema.has(t.table)).map((t) => `  - \`${t.table}\`: ${t.description}\n`).join('')}- \`audit/${AUDIT_TABLE}.jsonl\` — the audit trail: every change to every record (who, when, what, before
  and after), in order, one event per line.
- \`images/<storage key>\` — each image's original exactly as it was uploaded (its SHA-256 equals the
  image row's \`sha256\`, the fixity value kept since upload) and its display copies (\`screen_key\`,
  \`thumb_key\`). A bag made without images leaves these out.
- \`csv/prints.csv\`, \`csv/process-steps.csv\` — the catalogue as a spreadsheet opens it: UTF-8 with a byte
  order mark, one row per print (or step), ISO 8601 dates. Text a spreadsheet would run as a formula
  (starting with = + - @, a tab or a carriage return) starts with a single quote. Print columns:
  ${csvColumns.join(', ')}.
- \`dictionary/records/<table>.schema.json\` — a JSON Schema for each stored record type (the rows in
  the files above), and \`dictionary/contract/<type>.schema.json\` — the same records as Toneledger's
  API presents them.

## Values

Rows are stored records with their column names. Ids are UUIDs (the audit trail, fixity checks and
loan status changes use whole numbers); references name the other row's id (\`print_id\`,
\`maker_id\`, …). Times are ISO 8601 in UTC with microseconds; dates are \`YYYY-MM-DD\`; \`date_made\`
and paper dates are EDTF (ISO 8601-2). Numbers are as stored. Generated search columns are left out.

## Not in the bag

${Object.entries(LEFT_OUT_TABLES).map(([t, why]) => `- \`${t}\`: ${why}`).join('\n')}
`;
}
