import { QueryTypes, type Transaction } from 'sequelize';
import type { z } from 'zod';
import type { Display, displayInputSchema, displayUpdateSchema } from '@toneledger/common/schemas/exhibitions';
import { validatePeriod, type PeriodProblem } from '@toneledger/common/domain/light-dose';
import { DisplayPeriod, ExhibitionVenue } from '../models';
import { db } from '../db';
import { AppError, conflict, notFound, validationFailed } from '../errors';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import { presentDisplay } from '../presenters/exhibition.presenter';
import { recordAudit } from './audit.service';
import { assertPrintEditable } from './print-lock';
import { loadDisplays } from './display-rows';
import { refreshLightWarnings } from './light.service';
import type { Actor } from './print.service';
import { staleEdit } from './versioning';

type DisplayInput = z.infer<typeof displayInputSchema>;
type DisplayUpdate = z.infer<typeof displayUpdateSchema>;

const ENTITY = 'display';
const ALL_DAYS = [1, 2, 3, 4, 5, 6, 7];

/** The fields of a period that change its light; editing one of them after approval asks for approval again. */
const LIGHT_FIELDS = ['startsOn', 'endsOn', 'lux', 'hoursPerDay', 'daysOpen', 'closedDates'] as const;

const FIELD_OF: Record<PeriodProblem['field'], string> = {
  start: 'startsOn', end: 'endsOn', lux: 'lux', hoursPerDay: 'hoursPerDay', daysOpen: 'daysOpen', closedDates: 'closedDates',
};

interface Values {
  venueId: string | null;
  startsOn: string;
  endsOn: string;
  lux: number;
  hoursPerDay: number;
  daysOpen: number[];
  closedDates: string[];
  uv: number | null;
  caseOrFrame: string | null;
  mountNotes: string | null;
}

async function one(id: string, t: Transaction): Promise<Display> {
  const [row] = await loadDisplays({ ids: [id] }, t);
  return presentDisplay(row);
}

/** The checks of the light functions (the schema has made the same ones but for repeated weekdays), then the venue's dates. */
async function checkValues(exhibitionId: string, v: Values, t: Transaction): Promise<void> {
  const problems = validatePeriod({ start: v.startsOn, end: v.endsOn, lux: v.lux, hoursPerDay: v.hoursPerDay, daysOpen: v.daysOpen, closedDates: v.closedDates });
  const issues: FieldIssue[] = problems.map((p) => ({ path: FIELD_OF[p.field], message: p.message, code: 'invalid' }));
  if (!issues.length && v.venueId) {
    const venue = await ExhibitionVenue.findOne({ where: { id: v.venueId, exhibitionId }, transaction: t });
    if (!venue) issues.push({ path: 'venueId', message: 'This venue is not one of this exhibition’s', code: 'not_found' });
    else {
      if (v.startsOn < venue.opensOn) issues.push({ path: 'startsOn', message: `${venue.name} opens on ${venue.opensOn}; the display cannot start before`, code: 'outside_venue' });
      if (v.endsOn > venue.closesOn) issues.push({ path: 'endsOn', message: `${venue.name} closes on ${venue.closesOn}; the display cannot end after`, code: 'outside_venue' });
    }
  }
  if (issues.length) throw validationFailed(issues);
}

/** 409 naming the other exhibition and its dates when the print is already on display on one of these days. */
async function checkOverlap(printId: string, startsOn: string, endsOn: string, exceptId: string | null, t?: Transaction): Promise<void> {
  const [other] = await db().query<{ title: string; starts_on: string; ends_on: string }>(
    `SELECT e.title, to_char(d.starts_on, 'YYYY-MM-DD') AS starts_on, to_char(d.ends_on, 'YYYY-MM-DD') AS ends_on
       FROM display_periods d JOIN exhibitions e ON e.id = d.exhibition_id
      WHERE d.print_id = $1 AND daterange(d.starts_on, d.ends_on, '[]') && daterange($2::date, $3::date, '[]') AND d.id IS DISTINCT FROM $4::uuid
      ORDER BY d.starts_on LIMIT 1`,
    { bind: [printId, startsOn, endsOn, exceptId], transaction: t, type: QueryTypes.SELECT },
  );
  if (other) {
    throw conflict(`The print is already on display in “${other.title}” from ${other.starts_on} to ${other.ends_on}; a print can be in one display at a time.`, [
      { path: 'startsOn', message: `Overlaps “${other.title}”, ${other.starts_on} to ${other.ends_on}`, code: 'overlap' },
    ]);
  }
}

/** The exclusion constraint caught two periods saved at the same moment: the same 409, naming the other one once it can be read. */
async function rethrowOverlap(err: unknown, printId: string, startsOn: string, endsOn: string, exceptId: string | null): Promise<never> {
  const code = (err as { parent?: { code?: string }; original?: { code?: string } })?.parent?.code ?? (err as { original?: { code?: string } })?.original?.code;
  if (code === '23P01') {
    await checkOverlap(printId, startsOn, endsOn, exceptId);
    throw conflict('The print is already on display on some of these days; a print can be in one display at a time.');
  }
  throw err;
}

/** After a change that alters the light a print receives, an approved print goes back to waiting for a conservator. */
async function reopenApproval(exhibitionId: string, printId: string, actor: Actor, requestId: string | null, t: Transaction): Promise<void> {
  const [rows] = await db().query(
    `UPDATE exhibition_objects SET approval = 'pending', approved_by = NULL, approved_at = NULL, reason = NULL
      WHERE exhibition_id = $1 AND print_id = $2 AND approval = 'approved' RETURNING print_id`,
    { bind: [exhibitionId, printId], transaction: t },
  );
  if ((rows as unknown[]).length) {
    await recordAudit({
      actor, action: 'exhibition.approval_reopened', entityType: 'exhibition', entityId: exhibitionId,
      before: { printId, approval: 'approved' }, after: { printId, approval: 'pending', why: 'Its display periods changed after approval' }, requestId,
    }, t);
  }
}

export async function createDisplay(exhibitionId: string, input: DisplayInput, actor: Actor, requestId: string | null): Promise<Display> {
  const values: Values = {
    venueId: input.venueId ?? null, startsOn: input.startsOn, endsOn: input.endsOn, lux: input.lux, hoursPerDay: input.hoursPerDay,
    daysOpen: input.daysOpen ?? ALL_DAYS, closedDates: input.closedDates ?? [], uv: input.uvMicrowattsPerLumen ?? null,
    caseOrFrame: input.caseOrFrame ?? null, mountNotes: input.mountNotes ?? null,
  };
  try {
    return await db().transaction(async (t) => {
      const [object] = await db().query<{ approval: string }>(
        `SELECT o.approval FROM exhibition_objects o WHERE o.exhibition_id = $1 AND o.print_id = $2 FOR SHARE`,
        { bind: [exhibitionId, input.printId], transaction: t, type: QueryTypes.SELECT },
      );
      if (!object) {
        const [{ n }] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM exhibitions WHERE id = $1`, { bind: [exhibitionId], transaction: t, type: QueryTypes.SELECT });
        if (!n) throw notFound('The exhibition');
        throw conflict('The print is not on this exhibition’s object list; add it first.', [{ path: 'printId', message: 'Not on the object list', code: 'not_listed' }]);
      }
      if (object.approval === 'refused') {
        throw conflict('A conservator refused this print for display in this exhibition; it cannot have display periods.', [
          { path: 'printId', message: 'Refused for display', code: 'refused' },
        ]);
      }
      await assertPrintEditable(input.printId, t);
      await checkValues(exhibitionId, values, t);
      await checkOverlap(input.printId, values.startsOn, values.endsOn, null, t);
      const d = await DisplayPeriod.create({ ...values, printId: input.printId, exhibitionId }, { transaction: t });
      await reopenApproval(exhibitionId, input.printId, actor, requestId, t);
      await refreshLightWarnings(t, [input.printId]);
      const after = await one(d.id, t);
      await recordAudit({ actor, action: 'display.created', entityType: ENTITY, entityId: d.id, after, requestId }, t);
      return after;
    });
  } catch (err) {
    if (err instanceof AppError) throw err;
    return rethrowOverlap(err, input.printId, values.startsOn, values.endsOn, null);
  }
}

async function lockDisplay(id: string, version: number, t: Transaction): Promise<DisplayPeriod> {
  const d = await DisplayPeriod.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
  if (!d) throw notFound('The display period');
  await assertPrintEditable(d.printId, t);
  if (d.version !== version) throw await staleEdit(ENTITY, id, await one(id, t), t);
  return d;
}

export async function updateDisplay(id: string, update: DisplayUpdate, actor: Actor, requestId: string | null): Promise<Display> {
  let printId = '';
  let merged: Values | null = null;
  try {
    return await db().transaction(async (t) => {
      const d = await lockDisplay(id, update.version, t);
      printId = d.printId;
      const before = await one(id, t);
      const values: Values = {
        venueId: update.venueId !== undefined ? update.venueId : before.venueId,
        startsOn: update.startsOn ?? before.startsOn, endsOn: update.endsOn ?? before.endsOn,
        lux: update.lux ?? before.lux, hoursPerDay: update.hoursPerDay ?? before.hoursPerDay,
        daysOpen: update.daysOpen ?? before.daysOpen, closedDates: update.closedDates ?? before.closedDates,
        uv: update.uvMicrowattsPerLumen !== undefined ? update.uvMicrowattsPerLumen : before.uvMicrowattsPerLumen,
        caseOrFrame: update.caseOrFrame !== undefined ? update.caseOrFrame : before.caseOrFrame,
        mountNotes: update.mountNotes !== undefined ? update.mountNotes : before.mountNotes,
      };
      merged = values;
      await checkValues(d.exhibitionId, values, t);
      await checkOverlap(d.printId, values.startsOn, values.endsOn, id, t);
      await d.update({ ...values, version: d.version + 1 }, { transaction: t });
      const after = await one(id, t);
      const lightChanged = LIGHT_FIELDS.some((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k]));
      if (lightChanged) await reopenApproval(d.exhibitionId, d.printId, actor, requestId, t);
      await refreshLightWarnings(t, [d.printId]);
      await recordAudit({ actor, action: 'display.updated', entityType: ENTITY, entityId: id, before, after, requestId }, t);
      return after;
    });
  } catch (err) {
    const m = merged as Values | null;
    if (err instanceof AppError || !m) throw err;
    return rethrowOverlap(err, printId, m.startsOn, m.endsOn, id);
  }
}

export async function deleteDisplay(id: string, version: number, actor: Actor, requestId: string | null): Promise<void> {
  await db().transaction(async (t) => {
    const d = await lockDisplay(id, version, t);
    const before = await one(id, t);
    await d.destroy({ transaction: t });
    await refreshLightWarnings(t, [d.printId]);
    await recordAudit({ actor, action: 'display.deleted', entityType: ENTITY, entityId: id, before, requestId }, t);
  });
}
