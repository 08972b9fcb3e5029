import { db } from '../db';
import { ClimateFile, Location } from '../models';
import { insertReadings } from '../services/climate-file.service';
import { recordAudit } from '../services/audit.service';

/**
 * Invented hourly logger readings for the demo's two print stores, three years to the day before the
 * seed: Print Store 1 well controlled (about 16 °C, 40 % RH); Print Store 2 near its targets but with
 * a warm, damp spell in the last July and five days without readings in the last February (the
 * logger's battery). One accepted file per store and year, written in large batches; a file already
 * there is skipped, so a stopped seed carries on.
 */

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const YEARS = 3;

/** A small deterministic generator (mulberry32), so every demo has the same readings for the same day. */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The latest date before `end` that falls on month/day (UTC). */
function lastBefore(end: number, month: number, day: number): number {
  const y = new Date(end).getUTCFullYear();
  const at = Date.UTC(y, month - 1, day);
  return at < end ? at : Date.UTC(y - 1, month - 1, day);
}

interface Room { code: string; file: string; reading(at: number, r: () => number): { temperatureC: number; rhPercent: number } | null }

function rooms(end: number): Room[] {
  const season = (at: number) => Math.sin((2 * Math.PI * ((at / DAY) % 365.25 - 110)) / 365.25); // warmest about late July
  const daily = (at: number) => Math.sin((2 * Math.PI * ((at / HOUR) % 24 - 9)) / 24);
  const spellFrom = lastBefore(end, 7, 9);
  const spellTo = spellFrom + 9 * DAY;
  const gapFrom = lastBefore(end, 2, 10);
  const gapTo = gapFrom + 5 * DAY;
  return [
    {
      code: 'RH-PS1', file: 'print-store-1',
      reading: (at, r) => ({ temperatureC: 16 + 0.6 * season(at) + 0.1 * daily(at) + (r() - 0.5) * 0.3, rhPercent: 40 + 2 * season(at) + (r() - 0.5) * 1.2 }),
    },
    {
      code: 'RH-PS2', file: 'print-store-2',
      reading: (at, r) => {
        if (at >= gapFrom && at < gapTo) return null;
        // The spell rises over a day, holds, and falls over a day.
        const into = Math.min(Math.max((at - spellFrom) / DAY, 0), 1) * Math.min(Math.max((spellTo - at) / DAY, 0), 1);
        return {
          temperatureC: 15.8 + 1.2 * season(at) + 0.3 * daily(at) + 5.5 * into + (r() - 0.5) * 0.4,
          rhPercent: 44 + 4 * season(at) + 11 * into + (r() - 0.5) * 1.5,
        };
      },
    },
  ];
}

export async function seedDemoClimate(conservator: { id: string; name: string; role: 'conservator' }, log: (m: string) => void, options: { signal?: AbortSignal; now?: Date } = {}): Promise<number> {
  const end = Math.floor((options.now ?? new Date()).getTime() / DAY) * DAY; // today 00:00 UTC
  let written = 0;
  for (const room of rooms(end)) {
    const location = await Location.findOne({ where: { code: room.code } });
    if (!location) continue;
    for (let y = YEARS; y >= 1; y--) {
      options.signal?.throwIfAborted();
      const from = end - y * 365 * DAY;
      const to = from + 365 * DAY;
      const fileName = `${room.file}-${new Date(from).toISOString().slice(0, 10)}.csv`;
      if (await ClimateFile.findOne({ where: { locationId: location.id, fileName, status: 'accepted' } })) continue;
      const r = random(from / HOUR + room.code.length);
      const readings: { at: number; temperatureC: number; rhPercent: number }[] = [];
      for (let at = from; at < to; at += HOUR) {
        const v = room.reading(at, r);
        if (v) readings.push({ at, temperatureC: Math.round(v.temperatureC * 100) / 100, rhPercent: Math.round(v.rhPercent * 10) / 10 });
      }
      await db().transaction(async (t) => {
        const f = await ClimateFile.create({
          locationId: location.id, fileName, status: 'accepted', content: null, rowCount: readings.length, mapping: null, checkResult: null,
          acceptedRows: null, uploadedBy: conservator.id, uploadedAt: new Date(to), acceptedAt: new Date(to),
        }, { transaction: t });
        const n = await insertReadings(t, location.id, f.id, readings);
        await f.update({ acceptedRows: n }, { transaction: t });
        await recordAudit({ actor: conservator, action: 'climate_file.accepted', entityType: 'climate_file', entityId: f.id, after: { locationId: location.id, fileName, readings: readings.length, written: n }, requestId: 'seed' }, t);
        written += n;
      });
    }
  }
  log(`Wrote ${written.toLocaleString('en-GB')} invented logger readings for the print stores.`);
  return written;
}
