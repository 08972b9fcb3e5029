import { QueryTypes } from 'sequelize';
import type { MeasurementSession } from '@toneledger/common/schemas/measurements';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { db } from '../db';
import { conflict, notFound } from '../errors';
import { Image, MeasurementSession as SessionModel, MeasurementSpot, SpotReading } from '../models';
import { presentSession } from '../presenters/measurement.presenter';
import { recordAudit } from './audit.service';
import { presentImage, voidedCaptureDates } from './image.service';
import { voidedSessions } from './measurement.service';
import { assertPrintEditable } from './print-lock';
import type { Actor } from './print.service';
import { markScheduleStale } from './schedule-stale';
import { staleEdit } from './versioning';

/**
 * Voiding a mistaken record without losing it. A measurement session stays as recorded (the table
 * is append-only) and gains a row in `measurement_session_voids`; every analysis leaves it out
 * (rates, projections, the schedule's inputs, research outcomes) and the print is marked for
 * rescheduling, which recomputes both. A mistaken capture date of an image is kept in
 * `image_capture_date_voids` and the image is left without a date.
 */
export async function voidSession(id: string, reason: string, actor: Actor, requestId: string | null): Promise<MeasurementSession> {
  return db().transaction(async (t) => {
    const session = (await SessionModel.findByPk(id, { include: [{ model: SpotReading, as: 'readings' }], transaction: t })) as (SessionModel & { readings?: SpotReading[] }) | null;
    if (!session) throw notFound('The measurement session');
    await assertPrintEditable(session.printId, t);
    if ((await voidedSessions([session.printId], t)).has(id)) throw conflict('This session is already voided.');
    const baselineOf = await MeasurementSpot.findAll({ where: { baselineSessionId: id }, transaction: t });
    if (baselineOf.length) {
      throw conflict(`This session is the chosen baseline of ${baselineOf.map((s) => s.name).join(', ')}; choose another baseline first.`);
    }
    await db().query('INSERT INTO measurement_session_voids (session_id, print_id, reason, voided_by, voided_by_name) VALUES ($1, $2, $3, $4, $5)', {
      bind: [id, session.printId, reason, actor.id, actor.name], transaction: t,
    });
    await markScheduleStale(t, { printIds: [session.printId] });
    await recordAudit({ actor, action: 'measurement_session.voided', entityType: 'measurement_session', entityId: id, after: { printId: session.printId, measuredOn: session.measuredOn, reason }, requestId }, t);
    const spots = await MeasurementSpot.findAll({ where: { printId: session.printId }, order: [['createdAt', 'ASC']], transaction: t });
    const voided = (await voidedSessions([session.printId], t)).get(id)!;
    return { ...presentSession(session, session.readings ?? [], spots), voided };
  });
}

export async function voidCaptureDate(id: string, body: { reason: string; version: number }, actor: Actor, requestId: string | null): Promise<PrintImage> {
  const dto = await db().transaction(async (t) => {
    const row = await Image.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
    if (!row || row.withdrawnAt) throw notFound('The image');
    await assertPrintEditable(row.printId, t);
    if (row.version !== body.version) throw await staleEdit('image', id, presentImage(row, actor.role, null), t);
    if (!row.capturedOn) throw conflict('This image has no capture date to void.');
    const capturedOn = row.capturedOn;
    await db().query('INSERT INTO image_capture_date_voids (image_id, captured_on, reason, voided_by, voided_by_name) VALUES ($1, $2, $3, $4, $5)', {
      bind: [id, capturedOn, reason(body), actor.id, actor.name], type: QueryTypes.INSERT, transaction: t,
    });
    await row.update({ capturedOn: null, version: row.version + 1 }, { transaction: t });
    await recordAudit({ actor, action: 'image.capture_date_voided', entityType: 'image', entityId: id, before: { capturedOn }, after: { capturedOn: null, printId: row.printId, reason: body.reason }, requestId }, t);
    return presentImage(row, actor.role, null);
  });
  return { ...dto, voidedCaptureDates: (await voidedCaptureDates([id])).get(id) ?? [] };
}

const reason = (b: { reason: string }) => b.reason;
