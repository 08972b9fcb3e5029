import { approvalInputSchema, displayInputSchema, exhibitionInputSchema, exhibitionObjectInputSchema } from '@toneledger/common/schemas/exhibitions';
import { DisplayPeriod, Exhibition, ExhibitionObject, ExhibitionVenue } from '../models';
import { addObjects, createExhibition, decideObject } from '../services/exhibition.service';
import { createDisplay } from '../services/display.service';
import type { Actor } from '../services/print.service';
import { rngFor } from './demo-condition';

/**
 * The demo's exhibitions as plans, and their writer: an exhibition (matched by title), its object
 * list, its display periods (matched by print and first day) and the conservator's approvals, all
 * through the exhibition and display services, so light figures and warnings are the app's own.
 * A plan already partly written by an interrupted seed is completed, never written twice.
 */

export interface DisplayPlan {
  printId: string;
  /** Index into the exhibition's venues. */
  venue: number;
  startsOn: string;
  endsOn: string;
  lux: number;
  hoursPerDay: number;
  daysOpen: number[];
  closedDates: string[];
  caseOrFrame: string | null;
  mountNotes?: string | null;
}

export interface ExhibitionPlan {
  title: string;
  organiser: string;
  summary: string;
  venues: { name: string; place: string | null; opensOn: string; closesOn: string }[];
  displays: DisplayPlan[];
  /** Whether the conservator approves the object list (past and current shows; a coming loan waits). */
  approve: boolean;
}

/** Tuesday to Sunday: closed on Mondays. */
export const CLOSED_MONDAYS = [2, 3, 4, 5, 6, 7];

const DAY = 86_400_000;
export const addDays = (date: string, n: number) => new Date(Date.parse(`${date}T00:00:00Z`) + n * DAY).toISOString().slice(0, 10);

/** Christmas, Boxing Day and New Year's Day inside a period: the days the rooms are shut. */
export function holidaysIn(startsOn: string, endsOn: string): string[] {
  const out: string[] = [];
  for (let y = Number(startsOn.slice(0, 4)); y <= Number(endsOn.slice(0, 4)); y++) {
    for (const d of [`${y}-01-01`, `${y}-12-25`, `${y}-12-26`]) if (d >= startsOn && d <= endsOn) out.push(d);
  }
  return out.sort();
}

export interface RotationPrint {
  id: string;
  /** Lower lux for the light-sensitive prints. */
  lux: number;
}

/**
 * A spring rotation of the print room every year from 1994: four prints from the pool (a generator
 * of its own per year), plus any print placed in that year on purpose (`extra`), 8 hours a day,
 * closed on Mondays, for eight weeks from the first days of March.
 */
export function planRotations(pool: readonly string[], extra: ReadonlyMap<number, RotationPrint[]>, lastYear: number): ExhibitionPlan[] {
  const plans: ExhibitionPlan[] = [];
  for (let year = 1994; year <= lastYear; year++) {
    const r = rngFor(String(year), 'rotation');
    const left = [...pool];
    const chosen: RotationPrint[] = [];
    const placed = extra.get(year) ?? [];
    while (chosen.length < 4 && left.length) {
      const id = left.splice(r.int(0, left.length - 1), 1)[0];
      if (!placed.some((p) => p.id === id)) chosen.push({ id, lux: 50 });
    }
    chosen.push(...placed);
    const opensOn = `${year}-03-0${r.int(2, 6)}`;
    const closesOn = addDays(opensOn, 55);
    plans.push({
      title: `Print room rotation ${year}`,
      organiser: 'Calder Reach Photographic Trust',
      summary: `The print room's spring change of ${chosen.length} prints from the collection, shown in the wall cases under daylight-excluded tungsten light.`,
      venues: [{ name: 'Calder Reach, Print Room', place: 'Calder Reach', opensOn, closesOn }],
      displays: chosen.map((p) => ({
        printId: p.id, venue: 0, startsOn: opensOn, endsOn: closesOn, lux: p.lux, hoursPerDay: 8, daysOpen: CLOSED_MONDAYS, closedDates: [],
        caseOrFrame: 'Wall case, glazed with UV-filtering acrylic',
        mountNotes: p.lux < 50 ? 'Iron-blue toned: shown at reduced light, with the case blind drawn outside opening hours.' : null,
      })),
      approve: true,
    });
  }
  return plans;
}

export interface WrittenExhibition {
  id: string;
  created: boolean;
  displays: number;
}

/** Writes one planned exhibition (or completes the one an interrupted seed began). */
export async function writeExhibition(plan: ExhibitionPlan, registrar: Actor, conservator: Actor, signal?: AbortSignal): Promise<WrittenExhibition> {
  signal?.throwIfAborted();
  let exhibition = await Exhibition.findOne({ where: { title: plan.title }, attributes: ['id'] });
  const created = !exhibition;
  if (!exhibition) {
    const made = await createExhibition(
      exhibitionInputSchema.parse({ title: plan.title, organiser: plan.organiser, summary: plan.summary, venues: plan.venues }), registrar, 'seed',
    );
    exhibition = { id: made.id } as Exhibition;
  }
  const id = exhibition.id;
  const venues = await ExhibitionVenue.findAll({ where: { exhibitionId: id }, order: [['position', 'ASC']], attributes: ['id'] });
  const listed = new Set((await ExhibitionObject.findAll({ where: { exhibitionId: id }, attributes: ['printId'] })).map((o) => o.printId));
  const missing = [...new Set(plan.displays.map((d) => d.printId))].filter((p) => !listed.has(p));
  if (missing.length) {
    signal?.throwIfAborted();
    const version = (await Exhibition.findByPk(id, { attributes: ['version'] }))!.version;
    await addObjects(id, exhibitionObjectInputSchema.parse({ printIds: missing, version }), registrar, 'seed');
  }
  const existing = new Set((await DisplayPeriod.findAll({ where: { exhibitionId: id }, attributes: ['printId', 'startsOn'] })).map((d) => `${d.printId}:${d.startsOn}`));
  let displays = 0;
  for (const d of plan.displays) {
    if (existing.has(`${d.printId}:${d.startsOn}`)) continue;
    signal?.throwIfAborted();
    await createDisplay(
      id,
      displayInputSchema.parse({
        printId: d.printId, venueId: venues[d.venue].id, startsOn: d.startsOn, endsOn: d.endsOn, lux: d.lux, hoursPerDay: d.hoursPerDay,
        daysOpen: d.daysOpen, closedDates: d.closedDates, caseOrFrame: d.caseOrFrame, mountNotes: d.mountNotes ?? null,
      }),
      registrar,
      'seed',
    );
    displays += 1;
  }
  if (plan.approve) {
    const pending = await ExhibitionObject.findAll({ where: { exhibitionId: id, approval: 'pending' }, attributes: ['printId'], order: [['printId', 'ASC']] });
    for (const o of pending) {
      signal?.throwIfAborted();
      await decideObject(id, o.printId, approvalInputSchema.parse({ decision: 'approved' }), conservator, 'seed');
    }
  }
  return { id, created, displays };
}
