/**
 * Measurement histories and signed condition reports for the scale database (seed-scale.ts):
 * for every print three registered spots (maximum density, mid-tone, paper base) and about ten
 * sessions of three readings per spot, and two to four signed condition reports, some of which
 * record fading, silver mirroring or yellowing. Generated in JS (so each reading's mean, standard
 * deviation and largest pairwise ΔE00 come from the app's own `averageReadings`) and streamed into
 * PostgreSQL with COPY FROM STDIN, a batch of prints at a time.
 *
 * The fading follows an invented model like the demo's (DEVELOPERS.md, "Demo data for research"):
 * a rate per toner group with a log-normal spread per print, iron blue faster after an alkaline
 * after-bath and slowing as it fades, selenium slowest; a session's own offset and reading noise on
 * top. Deterministic per print number and seed (record ids count up in their first bits and are random after, see `orderedId`).
 */
import { randomUUID } from 'node:crypto';
import { pipeline } from 'node:stream/promises';
import { Readable } from 'node:stream';
import type pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import { averageReadings, type Lab } from '@toneledger/common/domain/colour';
import { analyseSpotHistory } from '@toneledger/common/domain/spot-analysis';
import { DEFAULT_NOTICEABLE_DELTA_E } from '@toneledger/common/domain/fading';
import { prng } from '../backend/src/seed/demo-catalogue';

export interface ProfileFacts {
  tonerClasses: string[];
  /** An alkaline after-bath (borax) in the process history. */
  alkaline: boolean;
  support: string;
  process: string;
}

type Lab3 = [number, number, number];
interface Group {
  /** Fading per year on a 0–1 scale (0 as made, 1 all but gone), before each print's spread. */
  rate: number;
  /** Where the curve levels off (iron blue); null for a steady rate. */
  limit: number | null;
  fresh: { dmax: Lab3; mid: Lab3; paper: Lab3 };
  faded: { dmax: Lab3; mid: Lab3; paper: Lab3 };
}

const SILVER = { fresh: { dmax: [7, 0.3, 0.6] as Lab3, mid: [48, 0.3, 1.2] as Lab3, paper: [94.5, 0, 2.5] as Lab3 }, faded: { dmax: [30, 1.5, 8] as Lab3, mid: [60, 1.2, 5] as Lab3, paper: [93.5, 0.3, 5] as Lab3 } };
const BLUE = { fresh: { dmax: [25, -1, -27] as Lab3, mid: [50, -6, -27] as Lab3, paper: [92.5, -1.8, -2.5] as Lab3 }, faded: { dmax: [47, -5, -9] as Lab3, mid: [72, -4.5, -4] as Lab3, paper: [93, -0.6, 2.5] as Lab3 } };
const WARM = { fresh: { dmax: [23, 8, 13] as Lab3, mid: [55, 9, 23] as Lab3, paper: [91, 1.5, 9] as Lab3 }, faded: { dmax: [33, 7, 13] as Lab3, mid: [64, 7, 20] as Lab3, paper: [90, 1.5, 12] as Lab3 } };

/** The invented rates: the same order as the demo's (borax iron blue fastest, selenium slowest). */
function groupOf(p: ProfileFacts): Group {
  const t = p.tonerClasses;
  if (p.process === 'cyanotype') return { rate: 0.006, limit: 0.4, ...BLUE };
  if (t.includes('iron_blue')) return { rate: p.alkaline ? 0.015 : 0.006, limit: 0.45, ...BLUE };
  if (t.includes('copper') || t.includes('vanadium')) return { rate: 0.004, limit: null, ...WARM };
  if (t.includes('sulfide') || t.includes('polysulfide')) return { rate: 0.005, limit: null, ...WARM };
  if (t.includes('selenium')) return { rate: 0.0007, limit: null, ...SILVER };
  if (t.includes('gold')) return { rate: 0.0012, limit: null, ...SILVER };
  return { rate: p.support === 'resin_coated' ? 0.0036 : 0.0026, limit: null, ...SILVER };
}

const INSTRUMENTS = [
  { until: 2003, instrument: 'Harlow Instruments SP-4 spectrophotometer', serial: 'SP4-01187', condition: null, aperture: '4 mm' },
  { until: 2015, instrument: 'Harlow Instruments SP-6 spectrophotometer', serial: 'SP6-22910', condition: 'M0', aperture: '4 mm' },
  { until: 9999, instrument: 'Brightwater Optics Lumen 45 spectrodensitometer', serial: 'BL45-03071', condition: 'M0', aperture: '3.5 mm' },
];
const MEASURERS = ['Perpetua Lanyon', 'Orrin Vellacott', 'Hesper Quarrington', 'Emrys Tregarthen'];
const SPOTS = [
  { purpose: 'dmax', name: 'Dmax, deepest shadow' },
  { purpose: 'mid_tone', name: 'Mid-tone' },
  { purpose: 'paper_base', name: 'Paper base, lower margin' },
] as const;

/**
 * A record id whose first 48 bits count up (the rest random, as in a version-4 id): rows written
 * in order land at the right edge of their indexes instead of all over them, which keeps the
 * millions of readings' primary-key and foreign-key indexes from thrashing the cache.
 */
let counter = Date.now() * 100;
function orderedId(): string {
  const hex = (counter++).toString(16).padStart(12, '0');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}${randomUUID().slice(13)}`;
}

const pad2 = (n: number) => String(n).padStart(2, '0');
const r2 = (v: number) => Math.round(v * 100) / 100;
const r4 = (v: number) => Math.round(v * 10000) / 10000;
/** Text-format COPY: tab-separated, \N for null (none of our texts hold a tab, newline or backslash). */
const line = (cells: (string | number | null)[]) => `${cells.map((x) => (x === null ? '\\N' : String(x))).join('\t')}\n`;

function dateOf(t: number): string {
  const year = Math.floor(t);
  const month = Math.min(12, 1 + Math.floor((t - year) * 12));
  const day = Math.min(28, 1 + Math.floor(((t - year) * 12 - (month - 1)) * 28));
  return `${year}-${pad2(month)}-${pad2(day)}`;
}

function densityFromL(L: number): number {
  const Y = L > 8 ? ((L + 16) / 116) ** 3 : L / 903.3;
  return -Math.log10(Y);
}

async function copy(c: pg.Client, sql: string, rows: string[]): Promise<void> {
  if (rows.length === 0) return;
  await pipeline(Readable.from(chunks(rows)), c.query(copyFrom(sql)));
}

function* chunks(rows: string[], size = 2000): Generator<string> {
  for (let i = 0; i < rows.length; i += size) yield rows.slice(i, i + size).join('');
}

export interface HistoryCounts {
  spots: number;
  sessions: number;
  readings: number;
  reports: number;
  observations: number;
}

/**
 * Writes the histories of every print of the temp table `plan` (n, id, profile, acq, year), in
 * batches; `profiles` are the seed's process profiles by index. Runs on the seed's connection.
 */
export async function seedScaleHistories(
  c: pg.Client, o: { prints: number; seed: number; profiles: ProfileFacts[]; log: (m: string) => void; batch?: number; today?: string },
): Promise<HistoryCounts> {
  const groups = o.profiles.map(groupOf);
  const today = o.today ?? new Date().toISOString().slice(0, 10);
  const now = Number(today.slice(0, 4)) + (Number(today.slice(5, 7)) - 1) / 12;
  const batch = o.batch ?? 10_000;
  const counts: HistoryCounts = { spots: 0, sessions: 0, readings: 0, reports: 0, observations: 0 };
  const timing = { generate: 0, measurements: 0, reports: 0 };
  for (let lo = 1; lo <= o.prints; lo += batch) {
    const hi = Math.min(o.prints, lo + batch - 1);
    const { rows } = await c.query<{ n: number; id: string; profile: number; acq: number; year: number }>(
      'SELECT n, id, profile, acq, year FROM plan WHERE n BETWEEN $1 AND $2 ORDER BY n', [lo, hi],
    );
    let t0 = performance.now();
    const spots: string[] = [];
    const sessions: string[] = [];
    const readings: string[] = [];
    const reports: string[] = [];
    const observations: string[] = [];
    const signed: string[] = [];
    for (const p of rows) {
      const g = groups[p.profile];
      const facts = o.profiles[p.profile];
      const r = prng((Math.imul(p.n, 0x9e3779b1) ^ (o.seed * 0x85ebca6b)) >>> 0);
      const gauss = () => (r.next() + r.next() + r.next() - 1.5) / 0.5;
      const rate = g.rate * Math.exp(0.35 * gauss());
      const limit = g.limit === null ? null : g.limit * (0.75 + r.next() * 0.5);
      const made = Math.min(p.year, p.acq);
      // Fading from a few years before accession (as in the demo, the store's housing drives it): iron
      // blue slows towards its limit, the rest is steady.
      const from = p.acq - 3 * r.next();
      const fadeAt = (t: number) => {
        const years = Math.max(0, t - from);
        return Math.min(0.9, limit === null ? years * rate : limit * (1 - Math.exp((-rate * years) / limit)));
      };
      const lab = (which: 'dmax' | 'mid' | 'paper', t: number): Lab3 => {
        const f = fadeAt(t);
        const a = g.fresh[which];
        const b = g.faded[which];
        return [a[0] + (b[0] - a[0]) * f, a[1] + (b[1] - a[1]) * f, a[2] + (b[2] - a[2]) * f];
      };

      // ── Measurements: three spots, about ten sessions from accession (or, for one in six, from the last decade) ──
      let start = Math.max(p.acq, 1990) + r.next() * 2;
      if (r.chance(0.17)) start = Math.max(start, 2014 + r.next() * 8);
      start = Math.min(start, now - 0.5);
      const nSessions = 9 + r.int(0, 2);
      const step = (now - 0.05 - start) / nSessions;
      const spotIds = SPOTS.map(() => orderedId());
      SPOTS.forEach((s, i) => spots.push(line([spotIds[i], p.id, s.name, s.purpose, 1])));
      let lastDate = '';
      for (let k = 0; k < nSessions; k++) {
        const t = start + step * (k + 0.2 + r.next() * 0.6);
        const date = dateOf(t);
        if (date <= lastDate || date > today) continue;
        lastDate = date;
        const era = INSTRUMENTS.find((x) => Math.floor(t) <= x.until)!;
        const sessionId = orderedId();
        sessions.push(line([sessionId, p.id, date, MEASURERS[p.n % MEASURERS.length], era.instrument, era.serial, 'D50', '2', '45/0', era.condition, era.aperture, 'White backing tile']));
        const drift = [0.3 * gauss(), 0.2 * gauss(), 0.25 * gauss()];
        SPOTS.forEach((s, i) => {
          const truth = lab(s.purpose === 'dmax' ? 'dmax' : s.purpose === 'mid_tone' ? 'mid' : 'paper', t);
          const centre = truth.map((v, j) => v + drift[j]);
          const labs: Lab[] = [0, 1, 2].map(() => ({
            L: r2(Math.min(100, Math.max(0, centre[0] + 0.12 * gauss()))), a: r2(centre[1] + 0.1 * gauss()), b: r2(centre[2] + 0.1 * gauss()),
          }));
          const sum = averageReadings(labs);
          readings.push(line([
            orderedId(), sessionId, spotIds[i], p.id, JSON.stringify(labs), r4(sum.mean.L), r4(sum.mean.a), r4(sum.mean.b), sum.n,
            sum.sd ? JSON.stringify({ L: r4(sum.sd.L), a: r4(sum.sd.a), b: r4(sum.sd.b) }) : null, r4(sum.maxPairwiseDeltaE00),
            s.purpose === 'dmax' ? r4(densityFromL(centre[0])) : null, s.purpose === 'dmax' ? 'visual' : null,
          ]));
        });
      }

      // ── Condition reports: two to four signed, recording what the model says can be seen ──
      const nReports = 2 + r.int(0, 2);
      const first = Math.max(p.acq, 1986) + r.next() * 3;
      const span = Math.max(0.5, now - 0.1 - first);
      const oldUntonedFibre = facts.tonerClasses.length === 0 && facts.support === 'fibre_baryta' && made <= 1975;
      const mirroringOnset = oldUntonedFibre ? Math.max(p.acq + 2, 1986 + r.int(0, 14)) : null;
      let lastReport = '';
      for (let k = 0; k < nReports; k++) {
        const t = first + (span * (k + r.next() * 0.8)) / nReports;
        const date = dateOf(t);
        if (date <= lastReport || date > today) continue;
        lastReport = date;
        const f = fadeAt(t);
        const obs: [string, string, string, string, string][] = [];
        const blue = facts.tonerClasses.includes('iron_blue') || facts.process === 'cyanotype';
        if ((blue || facts.tonerClasses.includes('sulfide') || facts.tonerClasses.includes('copper')) && f >= 0.05) {
          obs.push(['fading', 'image', f < 0.15 ? 'scattered' : 'overall', f < 0.15 ? 'slight' : f < 0.28 ? 'moderate' : 'severe', 'Loss of density and colour in the mid-tones.']);
        }
        if (blue && f >= 0.1) obs.push(['colour_shift', 'image', 'overall', f < 0.2 ? 'slight' : 'moderate', 'The blue has gone toward grey-green.']);
        if (mirroringOnset !== null && t > mirroringOnset) {
          const m = (t - mirroringOnset) / 40;
          if (m >= 0.06) obs.push(['silver_mirroring', 'edge', 'localised', m < 0.45 ? 'slight' : m < 0.85 ? 'moderate' : 'severe', 'Bluish sheen at the edges of the dark areas, seen at a low angle.']);
        }
        if (facts.support === 'resin_coated' && t - made > 20 && r.chance(0.5)) obs.push(['yellowing_highlights', 'overall', 'overall', 'slight', 'Slight yellowing of the highlights and of the paper base.']);
        if (r.chance(0.12)) obs.push([r.pick(['abrasion', 'crease', 'foxing', 'fingerprint', 'accretion']), 'margin', 'localised', 'slight', 'Minor, stable.']);
        const severe = obs.some((x) => x[3] === 'severe');
        const moderate = obs.some((x) => x[3] === 'moderate');
        const grade = severe ? 'poor' : moderate ? 'fair' : obs.length ? (r.chance(0.5) ? 'good' : 'fair') : 'good';
        const reportId = orderedId();
        const signedAt = `${date}T16:00:00Z`;
        reports.push(line([
          reportId, p.id, date, MEASURERS[(p.n + k) % MEASURERS.length], k === 0 ? 'incoming' : r.pick(['routine', 'routine', 'survey', 'before_display', 'after_display']), grade,
          obs.length ? `${obs.length} condition${obs.length > 1 ? 's' : ''} noted.` : 'Stable; nothing new since the last examination.', 'draft', signedAt, signedAt,
        ]));
        signed.push(reportId);
        obs.forEach(([term, area, extent, severity, notes], i) => observations.push(line([reportId, i + 1, term, 'recto', area, extent, severity, notes])));
      }
    }
    timing.generate += performance.now() - t0;
    t0 = performance.now();
    await copy(c, 'COPY measurement_spots (id, print_id, name, purpose, version) FROM STDIN', spots);
    await copy(c, 'COPY measurement_sessions (id, print_id, measured_on, measured_by_name, instrument, serial, illuminant, observer, geometry, condition, aperture, backing) FROM STDIN', sessions);
    await copy(c, 'COPY spot_readings (id, session_id, spot_id, print_id, readings, mean_l, mean_a, mean_b, n, sd, max_pairwise_de, density, density_type) FROM STDIN', readings);
    timing.measurements += performance.now() - t0;
    t0 = performance.now();
    // Reports go in as drafts with their observations, then are signed (the database locks a signed report's observations).
    await copy(c, 'COPY condition_reports (id, print_id, examined_on, examiner_name, context, grade, summary, status, created_at, updated_at) FROM STDIN', reports);
    await copy(c, 'COPY observations (report_id, position, term_code, side, area, extent, severity, notes) FROM STDIN', observations);
    await c.query("UPDATE condition_reports SET status = 'signed', signed_at = updated_at WHERE id = ANY($1::uuid[])", [signed]);
    timing.reports += performance.now() - t0;
    counts.spots += spots.length;
    counts.sessions += sessions.length;
    counts.readings += readings.length;
    counts.reports += reports.length;
    counts.observations += observations.length;
    if (hi % 50_000 === 0 || hi === o.prints) o.log(`  histories for prints ${hi.toLocaleString('en-GB')} of ${o.prints.toLocaleString('en-GB')}`);
  }
  o.log(`  generating ${(timing.generate / 1000).toFixed(1)} s, COPY of measurements ${(timing.measurements / 1000).toFixed(1)} s, reports and observations ${(timing.reports / 1000).toFixed(1)} s`);
  return counts;
}

/**
 * The maximum-density spot of a sample of prints run through the app's analysis (`analyseSpotHistory`),
 * per toner group: how many have a rate, the median ΔE00 a year and the median half-width of its
 * 95 % interval, and how many reached the noticeable change. A check by eye that the groups differ.
 */
export async function summariseScaleRates(c: pg.Client, sample = 3000): Promise<string[]> {
  const { rows } = await c.query<{ grp: string; sessions: { id: string; on: string; L: number; a: number; b: number; d: number | null; cond: string | null }[] }>(
    `SELECT CASE WHEN 'iron_blue' = ANY(p.toner_classes) OR p.process = 'cyanotype' THEN
                   CASE WHEN EXISTS (SELECT 1 FROM process_steps s WHERE s.print_id = p.id AND s.type = 'after_bath' AND s.alkaline) THEN 'iron blue, alkaline after-bath' ELSE 'iron blue' END
                 WHEN p.toner_classes && '{sulfide,polysulfide}' THEN 'sulfide' WHEN 'selenium' = ANY(p.toner_classes) THEN 'selenium'
                 WHEN p.toner_classes = '{}' THEN 'untoned' ELSE 'other' END AS grp,
            (SELECT json_agg(json_build_object('id', ms.id, 'on', ms.measured_on, 'L', r.mean_l, 'a', r.mean_a, 'b', r.mean_b, 'd', r.density, 'cond', ms.condition) ORDER BY ms.measured_on)
               FROM measurement_spots sp JOIN spot_readings r ON r.spot_id = sp.id JOIN measurement_sessions ms ON ms.id = r.session_id
              WHERE sp.print_id = p.id AND sp.purpose = 'dmax') AS sessions
       FROM (SELECT * FROM prints ORDER BY id LIMIT $1) p`,
    [sample],
  );
  const byGroup = new Map<string, { rate: number; half: number; reached: boolean }[]>();
  for (const row of rows) {
    if (!row.sessions) continue;
    const change = analyseSpotHistory(
      row.sessions.map((x) => ({
        sessionId: x.id, measuredOn: x.on, recordedAt: x.on, conditions: { illuminant: 'D50', observer: '2', geometry: '45/0', condition: x.cond as 'M0' | null },
        lab: { L: Number(x.L), a: Number(x.a), b: Number(x.b) }, density: x.d === null ? null : Number(x.d), densityType: x.d === null ? null : 'visual', reflectance: null,
      })),
      { baselineSessionId: null, threshold: DEFAULT_NOTICEABLE_DELTA_E },
    );
    if (!change.rate?.ok) continue;
    const list = byGroup.get(row.grp) ?? [];
    list.push({ rate: change.rate.slopePerYear, half: (change.rate.ci95[1] - change.rate.ci95[0]) / 2, reached: change.points.some((x) => x.comparable && x.dE00 >= DEFAULT_NOTICEABLE_DELTA_E) });
    byGroup.set(row.grp, list);
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  return [...byGroup.entries()].sort().map(([g, xs]) =>
    `${g.padEnd(32)} n ${String(xs.length).padStart(5)}  median ${median(xs.map((x) => x.rate)).toFixed(3)} ΔE00/yr  ±${median(xs.map((x) => x.half)).toFixed(3)}  reached ${xs.filter((x) => x.reached).length}`);
}
