import type { Transaction } from 'sequelize';
import type { ClimateSettings } from '@toneledger/common/schemas/climate';
import { DEFAULT_CLIMATE_SETTINGS } from '@toneledger/common/domain/isoperm';
import { Setting } from '../models';
import { db } from '../db';
import { recordAudit, type AuditActor } from './audit.service';
import { markScheduleStale } from './schedule-stale';

/**
 * The climate settings (target ranges with their source, the reference climate, the isoperm
 * constants, brief-excursion and gap lengths), stored like the other settings sections; a collection
 * starts from the pure module's defaults (`DEFAULT_CLIMATE_SETTINGS`).
 */
const KEY = 'climate';

export async function getClimateSettings(transaction?: Transaction): Promise<ClimateSettings> {
  const row = await Setting.findByPk(KEY, { transaction });
  return { ...DEFAULT_CLIMATE_SETTINGS, ...((row?.value as Partial<ClimateSettings> | undefined) ?? {}) };
}

export async function putClimateSettings(next: ClimateSettings, actor: AuditActor, requestId: string | null): Promise<ClimateSettings> {
  return db().transaction(async (t) => {
    const before = await getClimateSettings(t);
    await Setting.upsert({ key: KEY, value: next }, { transaction: t });
    await recordAudit({ actor, action: 'settings.updated', entityType: 'settings', entityId: KEY, before, after: next, requestId }, t);
    // The permanence of every store with readings feeds the risk model: its prints are rescheduled.
    await markScheduleStale(t, { climateStores: true });
    return next;
  });
}
