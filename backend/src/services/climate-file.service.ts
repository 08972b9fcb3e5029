import { QueryTypes, type Transaction } from 'sequelize';
import { parse } from 'csv-parse/sync';
import { isDeepStrictEqual } from 'node:util';
import type { ClimateFile as ClimateFileDto, ClimateMapping } from '@toneledger/common/schemas/climate';
import { readClimateRows, suggestMapping, type ReadOutcome } from '@toneledger/common/domain/climate-readings';
import { db } from '../db';
import { conflict, notFound, validationFailed } from '../errors';
import { ClimateFile, Location, User } from '../models';
import { presentClimateFile, type FileHead, type StoredCheck } from '../presenters/climate.presenter';
import { recordAudit } from './audit.service';
import type { Actor } from './print.service';
import { markScheduleStale } from './schedule-stale';

/**
 * Logger files: upload (the text kept, nothing read into the readings), check with a mapping (every
 * row read, the bad ones named, duplicates against the readings held counted), accept (the readings
 * written in large batches, readings held kept, audited, the prints stored there marked for
 * rescheduling, all in one transaction), discard.
 */

export const MAX_CLIMATE_BYTES = 32 * 1024 * 1024;
export const MAX_CLIMATE_ROWS = 600_000;
/** Rows per INSERT … SELECT unnest(…) statement. */
export const INSERT_BATCH = 25_000;
const SAMPLE_ROWS = 10;
const PREVIEW_ROWS = 20;
const SAVE_AS = 'Export the logger file as CSV in UTF-8.';

interface Parsed { header: string[]; rows: string[][]; firstRow: number }

/** The CSV's header (its first non-blank row) and the data rows after it; blank rows are skipped, numbering kept. */
export function parseClimateCsv(text: string, toLine?: number): Parsed {
  let records: string[][];
  try {
    records = parse(text, { bom: true, relax_column_count: true, skip_empty_lines: false, trim: false, ...(toLine ? { to_line: toLine } : {}) }) as string[][];
  } catch (err) {
    throw validationFailed([{ path: 'file', message: `The file could not be read as CSV: ${(err as Error).message}`, code: 'csv' }], 'The file cannot be read.');
  }
  const blank = (r: string[]) => r.every((c) => c.trim() === '');
  const start = records.findIndex((r) => !blank(r));
  if (start < 0) throw validationFailed([{ path: 'file', message: 'The file is empty', code: 'empty' }], 'The file cannot be read.');
  const header = records[start].map((h) => h.trim());
  const rows = records.slice(start + 1);
  return { header, rows, firstRow: start };
}

/** Reads every data row of a stored file with a mapping (row numbers count the header as row 1). */
function readFile(text: string, mapping: ClimateMapping): ReadOutcome {
  const { header, rows } = parseClimateCsv(text);
  // Blank rows are left out, but the row numbers stay those of the file.
  const kept: string[][] = [];
  const numbers: number[] = [];
  rows.forEach((r, i) => { if (!r.every((c) => c.trim() === '')) { kept.push(r); numbers.push(i + 2); } });
  const out = readClimateRows(header, kept, mapping);
  const renumber = (n: number) => (n >= 2 ? numbers[n - 2] ?? n : n);
  return {
    ...out,
    rows: out.rows.map(renumber),
    problems: out.problems.map((p) => ({ ...p, row: renumber(p.row), message: p.message.replace(/row (\d+)/, (_, d) => `row ${renumber(Number(d))}`) })),
  };
}

async function locationOf(id: string, t?: Transaction): Promise<Location> {
  const l = await Location.findByPk(id, { transaction: t });
  if (!l) throw notFound('The location');
  return l;
}

async function present(f: ClimateFile, t?: Transaction): Promise<ClimateFileDto> {
  const [loc, user] = await Promise.all([Location.findByPk(f.locationId, { transaction: t }), User.findByPk(f.uploadedBy, { transaction: t })]);
  return presentClimateFile(f, loc?.pathLabel ?? '', { id: f.uploadedBy, name: user?.name ?? '' });
}

async function fileOf(id: string, t?: Transaction, lock = false): Promise<ClimateFile> {
  const f = await ClimateFile.findByPk(id, { transaction: t, lock: lock && t ? t.LOCK.UPDATE : undefined });
  if (!f) throw notFound('The climate file');
  return f;
}

export async function uploadClimateFile(locationId: string, file: { name: string; text: string }, actor: Actor, requestId: string | null): Promise<ClimateFileDto> {
  await locationOf(locationId);
  const { header, rows } = parseClimateCsv(file.text);
  const issues = [];
  if (header.some((h) => h === '')) issues.push({ path: 'file', message: 'Every column of the header needs a name', code: 'columns' });
  const twice = header.filter((h, i) => header.indexOf(h) !== i);
  if (twice.length) issues.push({ path: 'file', message: `Columns named twice: ${[...new Set(twice)].join(', ')}`, code: 'columns' });
  const data = rows.filter((r) => !r.every((c) => c.trim() === ''));
  if (data.length === 0) issues.push({ path: 'file', message: 'The file has a header and no readings', code: 'empty' });
  if (data.length > MAX_CLIMATE_ROWS) issues.push({ path: 'file', message: `At most ${MAX_CLIMATE_ROWS.toLocaleString('en')} rows per file`, code: 'too_many' });
  if (issues.length) throw validationFailed(issues, 'The file cannot be loaded.');
  const head: FileHead = { columns: header, sample: data.slice(0, SAMPLE_ROWS).map((r) => r.map((c) => c.slice(0, 200))), suggested: suggestMapping(header) };
  return db().transaction(async (t) => {
    const f = await ClimateFile.create({
      locationId, fileName: file.name || 'logger.csv', content: file.text, rowCount: data.length, mapping: null,
      checkResult: { head, check: null } satisfies StoredCheck, acceptedRows: null, uploadedBy: actor.id as string, acceptedAt: null,
    }, { transaction: t });
    await recordAudit({ actor, action: 'climate_file.uploaded', entityType: 'climate_file', entityId: f.id, after: { locationId, fileName: f.fileName, rowCount: f.rowCount }, requestId }, t);
    return present(f, t);
  });
}

/** How many of these instants the location already holds. */
async function heldAmong(locationId: string, instants: readonly number[], t?: Transaction): Promise<number> {
  let held = 0;
  for (let i = 0; i < instants.length; i += INSERT_BATCH) {
    const chunk = instants.slice(i, i + INSERT_BATCH).map((ms) => new Date(ms).toISOString());
    const [row] = await db().query<{ n: string }>(
      `SELECT count(*) AS n FROM climate_readings r JOIN unnest($2::timestamptz[]) AS x(at) ON r.taken_at = x.at WHERE r.location_id = $1`,
      { bind: [locationId, chunk], transaction: t, type: QueryTypes.SELECT },
    );
    held += Number(row.n);
  }
  return held;
}

export async function checkClimateFile(id: string, mapping: ClimateMapping): Promise<ClimateFileDto> {
  const f = await fileOf(id);
  if (f.status === 'accepted' || f.status === 'discarded') throw conflict(`This file is ${f.status}; upload it again to read it another way.`);
  const out = readFile(f.content ?? '', mapping);
  const instants = out.readings.map((r) => r.at);
  let first = Infinity; let last = -Infinity;
  for (const ms of instants) { if (ms < first) first = ms; if (ms > last) last = ms; }
  const check: NonNullable<ClimateFileDto['check']> = {
    goodRows: out.readings.length,
    badRows: out.badRows,
    problems: out.problems,
    firstAt: instants.length ? new Date(first).toISOString() : null,
    lastAt: instants.length ? new Date(last).toISOString() : null,
    duplicates: await heldAmong(f.locationId, instants),
    preview: out.readings.slice(0, PREVIEW_ROWS).map((r) => ({ takenAt: new Date(r.at).toISOString(), temperatureC: r.temperatureC, rhPercent: r.rhPercent })),
  };
  const head = (f.checkResult as StoredCheck).head;
  return db().transaction(async (t) => {
    const locked = await fileOf(id, t, true);
    if (locked.status !== 'uploaded' && locked.status !== 'checked') throw conflict(`This file is ${locked.status}.`);
    await locked.update({ mapping, checkResult: { head, check } satisfies StoredCheck, status: 'checked' }, { transaction: t });
    return present(locked, t);
  });
}

export async function acceptClimateFile(id: string, mapping: ClimateMapping, actor: Actor, requestId: string | null): Promise<ClimateFileDto> {
  const f = await fileOf(id);
  if (f.status !== 'checked') throw conflict(f.status === 'uploaded' ? 'Check the file with a mapping before accepting it.' : `This file is ${f.status}.`);
  if (!isDeepStrictEqual(f.mapping, mapping)) throw conflict('The mapping is not the one the file was checked with: check it again.');
  const stored = f.checkResult as StoredCheck;
  if (!stored.check || stored.check.badRows > 0) {
    throw conflict(`${stored.check?.badRows ?? 'Some'} rows cannot be read; correct the file or the mapping and check again.`, { problems: stored.check?.problems.slice(0, 20) ?? [] });
  }
  const out = readFile(f.content ?? '', mapping);
  if (out.badRows > 0) throw conflict('Rows of this file cannot be read; check it again.');
  return db().transaction(async (t) => {
    const locked = await fileOf(id, t, true);
    if (locked.status !== 'checked') throw conflict(`This file is ${locked.status}.`);
    const inserted = await insertReadings(t, locked.locationId, locked.id, out.readings);
    await locked.update({ status: 'accepted', acceptedRows: inserted, acceptedAt: new Date(), content: null }, { transaction: t });
    await recordAudit({
      actor, action: 'climate_file.accepted', entityType: 'climate_file', entityId: locked.id,
      after: { locationId: locked.locationId, fileName: locked.fileName, mapping, readings: out.readings.length, written: inserted, alreadyHeld: out.readings.length - inserted },
      requestId,
    }, t);
    await markScheduleStale(t, { locationId: locked.locationId });
    return present(locked, t);
  });
}

/** Writes readings in batches of multi-row INSERT … SELECT unnest(…); readings held at the same instant are kept. Returns how many were written. */
export async function insertReadings(t: Transaction, locationId: string, fileId: string, readings: readonly { at: number; temperatureC: number; rhPercent: number }[]): Promise<number> {
  let written = 0;
  for (let i = 0; i < readings.length; i += INSERT_BATCH) {
    const chunk = readings.slice(i, i + INSERT_BATCH);
    const [, count] = (await db().query(
      `INSERT INTO climate_readings (location_id, taken_at, temperature_c, rh_percent, file_id)
       SELECT $1, to_timestamp(x.ms / 1000.0), x.t, x.rh, $2 FROM unnest($3::float8[], $4::real[], $5::real[]) AS x(ms, t, rh)
       ON CONFLICT (location_id, taken_at) DO NOTHING`,
      { bind: [locationId, fileId, chunk.map((r) => r.at), chunk.map((r) => r.temperatureC), chunk.map((r) => r.rhPercent)], transaction: t, type: QueryTypes.INSERT },
    )) as unknown as [unknown, number];
    written += count;
  }
  return written;
}

export async function discardClimateFile(id: string, actor: Actor, requestId: string | null): Promise<void> {
  await db().transaction(async (t) => {
    const f = await fileOf(id, t, true);
    if (f.status === 'accepted') throw conflict('An accepted file cannot be discarded; its readings are kept.');
    if (f.status === 'discarded') throw conflict('This file is already discarded.');
    await f.update({ status: 'discarded', content: null }, { transaction: t });
    await recordAudit({ actor, action: 'climate_file.discarded', entityType: 'climate_file', entityId: f.id, after: { locationId: f.locationId, fileName: f.fileName }, requestId }, t);
  });
}

export async function getClimateFile(id: string): Promise<ClimateFileDto> {
  return present(await fileOf(id));
}

export async function listClimateFiles(locationId: string): Promise<ClimateFileDto[]> {
  const loc = await locationOf(locationId);
  const files = await ClimateFile.findAll({ where: { locationId }, order: [['uploadedAt', 'DESC'], ['id', 'ASC']], attributes: { exclude: ['content'] } });
  const users = new Map((await User.findAll({ where: { id: [...new Set(files.map((f) => f.uploadedBy))] } })).map((u) => [u.id, u.name]));
  return files.map((f) => presentClimateFile(f, loc.pathLabel, { id: f.uploadedBy, name: users.get(f.uploadedBy) ?? '' }));
}

export const CLIMATE_SAVE_AS = SAVE_AS;
