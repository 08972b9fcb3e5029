import { QueryTypes, type Transaction } from 'sequelize';
import type { ReferenceTo } from '@toneledger/common/fields/field';
import { db } from '../db';
import { BathRecipe, EnclosureType, Location, Maker, Paper } from '../models';
import { paperLabel } from '../presenters/catalogue.presenter';
import { getCatalogueSettings } from './settings.service';
import { PRINT_ROWS_SQL, STEP_ROWS_SQL, type DbRow } from './print-csv';

/**
 * What an import matches a file against: the records a print refers to (by name, ignoring case)
 * and the prints already in the catalogue with the file's accession numbers.
 */

export interface Named {
  id: string;
  /** The record's name as the catalogue writes it (a paper's label, a place's path). */
  name: string;
  alkalineBuffered?: boolean | null;
  patResult?: 'passed' | 'failed' | 'not_tested';
}

/** Records by lower-case name; a name two records share is ambiguous. */
export class NameIndex {
  private byName = new Map<string, Named | 'ambiguous'>();
  add(name: string, record: Named) {
    const key = name.trim().toLowerCase();
    const had = this.byName.get(key);
    this.byName.set(key, had && had !== 'ambiguous' && had.id !== record.id ? 'ambiguous' : record);
  }
  get(name: string): Named | 'ambiguous' | undefined {
    return this.byName.get(name.trim().toLowerCase());
  }
}

export type Lookups = Record<ReferenceTo, NameIndex> & { pattern: string };

export async function loadLookups(t?: Transaction): Promise<Lookups> {
  // Inside a transaction the reads share its one connection, so they run one after the other; outside, together.
  const reads = [
    () => Maker.findAll({ attributes: ['id', 'name'], transaction: t }),
    () => Paper.findAll({ attributes: ['id', 'manufacturer', 'product', 'surface'], transaction: t }),
    () => Location.findAll({ attributes: ['id', 'pathLabel', 'code'], transaction: t }),
    () => EnclosureType.findAll({ transaction: t }),
    () => BathRecipe.findAll({ attributes: ['id', 'name'], transaction: t }),
  ] as const;
  const [makers, papers, locations, enclosures, recipes] = t
    ? [await reads[0](), await reads[1](), await reads[2](), await reads[3](), await reads[4]()]
    : await Promise.all([reads[0](), reads[1](), reads[2](), reads[3](), reads[4]()]);
  const settings = await getCatalogueSettings();
  const l: Lookups = {
    maker: new NameIndex(), paper: new NameIndex(), location: new NameIndex(), enclosure: new NameIndex(), recipe: new NameIndex(),
    pattern: settings.accessionPattern,
  };
  for (const m of makers) l.maker.add(m.name, { id: m.id, name: m.name });
  for (const p of papers) l.paper.add(paperLabel(p), { id: p.id, name: paperLabel(p) });
  for (const loc of locations) {
    const named = { id: loc.id, name: loc.pathLabel };
    l.location.add(loc.pathLabel, named);
    l.location.add(loc.pathLabel.replace(/\s*›\s*/g, ' > '), named);
    if (loc.code) l.location.add(loc.code, named);
  }
  for (const e of enclosures) l.enclosure.add(e.name, { id: e.id, name: e.name, alkalineBuffered: e.alkalineBuffered, patResult: e.patResult });
  for (const r of recipes) l.recipe.add(r.name, { id: r.id, name: r.name });
  return l;
}

/** A print in the catalogue as its database row, with its steps' rows in order. */
export interface Existing {
  row: DbRow;
  steps: DbRow[];
}

/**
 * The prints whose accession numbers (lower case) are given, by lower-case accession number. With
 * `lock`, their rows stay locked until the transaction ends, so nobody edits them in between.
 */
export async function loadExisting(accessions: string[], t?: Transaction, lock = false): Promise<Map<string, Existing>> {
  const out = new Map<string, Existing>();
  if (!accessions.length) return out;
  if (lock) {
    await db().query('SELECT id FROM prints WHERE lower(accession_number) = ANY($1) ORDER BY id FOR UPDATE', { bind: [accessions], transaction: t });
  }
  const rows = await db().query<DbRow>(`${PRINT_ROWS_SQL} WHERE lower(p.accession_number) = ANY($1)`, { bind: [accessions], type: QueryTypes.SELECT, transaction: t });
  if (!rows.length) return out;
  const steps = await db().query<DbRow>(`${STEP_ROWS_SQL} WHERE s.print_id = ANY($1) ORDER BY s.position`, {
    bind: [rows.map((r) => r.id)], type: QueryTypes.SELECT, transaction: t,
  });
  for (const row of rows) {
    out.set(String(row.accession_number).toLowerCase(), { row, steps: steps.filter((s) => s.print_id === row.id) });
  }
  return out;
}
