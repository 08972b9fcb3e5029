import { QueryTypes, type Transaction } from 'sequelize';
import type { z } from 'zod';
import type { LightSettings, PrintLight, overBudgetItemSchema, responsivityOverrideInputSchema } from '@toneledger/common/schemas/light';
import { cumulativeSeries, exposureByYear, rollingExposure, type DisplayPeriodInput } from '@toneledger/common/domain/light-dose';
import { budgetStatus, lightWarnings, REST_RULE, type BudgetStatus, type LightCategory } from '@toneledger/common/domain/light-budget';
import { fitLightCost, type LightCostResult, type LightCostSession } from '@toneledger/common/domain/light-cost';
import { latestDeltaE00, fittedPoints } from '@toneledger/common/domain/spot-analysis';
import { categoryByRules } from '@toneledger/common/domain/light-rules';
import { Setting } from '../models';
import { db } from '../db';
import { notFound } from '../errors';
import { presentDisplay } from '../presenters/exhibition.presenter';
import { recordAudit } from './audit.service';
import { assertPrintEditable } from './print-lock';
import { loadDisplays, periodOf, todayIso, type DisplayRow } from './display-rows';
import { getLightSettings, recomputeCategories } from './light-settings.service';
import { printSpotChanges } from './measurement.service';
import type { Actor } from './print.service';
import { staleEdit } from './versioning';
import { markScheduleStale } from './schedule-stale';

type OverrideInput = z.infer<typeof responsivityOverrideInputSchema>;
type OverBudgetItem = z.infer<typeof overBudgetItemSchema>;

/** The print columns the light figures read. */
interface LightPrintRow {
  id: string;
  accession_number: string;
  title: string;
  process: string;
  toner_classes: string[];
  light_responsivity: LightCategory | null;
  light_responsivity_override: LightCategory | null;
  light_override_reason: string | null;
  light_override_by: string | null;
  override_by_name: string | null;
  over_light_budget: boolean;
  version: number;
}

async function lightPrints(ids: readonly string[], t?: Transaction, lock = false): Promise<LightPrintRow[]> {
  if (!ids.length) return [];
  return db().query<LightPrintRow>(
    `SELECT p.id, p.accession_number, p.title, p.process, p.toner_classes, p.light_responsivity, p.light_responsivity_override,
            p.light_override_reason, p.light_override_by, u.name AS override_by_name, p.over_light_budget, p.version
       FROM prints p LEFT JOIN users u ON u.id = p.light_override_by
      WHERE p.id = ANY ($1::uuid[])${lock ? ' FOR UPDATE OF p' : ''}`,
    { bind: [ids], transaction: t, type: QueryTypes.SELECT },
  );
}

/** The effective category: the stored one (the server keeps it current), or computed when a row predates it. */
function categoryOf(p: LightPrintRow, settings: LightSettings): LightCategory {
  return p.light_responsivity_override ?? p.light_responsivity ?? categoryByRules(settings, p.process, p.toner_classes);
}

export function statusOf(periods: readonly DisplayPeriodInput[], category: LightCategory, settings: LightSettings, asOf: string, planned?: DisplayPeriodInput[]) {
  return budgetStatus({ periods, category, budgets: settings.budgets, asOf, planned });
}

/**
 * The stored warning: the print is past its light budget when, counting the displays recorded,
 * past and scheduled, its exposure over any 12 months reaches past the annual budget (now or in a
 * scheduled display), or a display not yet ended is brighter than its category's maximum.
 */
export function pastBudget(s: BudgetStatus, asOf: string): boolean {
  if (s.annualBudget !== null && (s.usedRolling12 > s.annualBudget || s.scheduledExceeds)) return true;
  return s.luxOverMax.some((o) => o.period.end >= asOf);
}

/** Recomputes the stored light warning of the prints named (or of every print with a display period). */
export async function refreshLightWarnings(t: Transaction, printIds?: readonly string[], settings?: LightSettings): Promise<void> {
  const s = settings ?? (await getLightSettings(t));
  const ids = printIds ?? (await db().query<{ id: string }>(
    `SELECT DISTINCT print_id AS id FROM display_periods UNION SELECT id FROM prints WHERE over_light_budget`,
    { transaction: t, type: QueryTypes.SELECT },
  )).map((r) => r.id);
  const asOf = todayIso();
  // The light warning and the coming displays are inputs of the inspection schedule.
  await markScheduleStale(t, { printIds: ids });
  for (let i = 0; i < ids.length; i += 500) {
    const chunk = ids.slice(i, i + 500);
    // One after the other: both run on the transaction's one connection.
    const prints = await lightPrints(chunk, t);
    const rows = await loadDisplays({ printIds: chunk }, t);
    const flags = prints.map((p) => {
      const periods = rows.filter((r) => r.print_id === p.id).map(periodOf);
      return periods.length > 0 && pastBudget(statusOf(periods, categoryOf(p, s), s, asOf), asOf);
    });
    await db().query(
      `UPDATE prints p SET over_light_budget = f.flag,
              warning_codes = array_remove(p.warning_codes, 'over_light_budget') || CASE WHEN f.flag THEN '{over_light_budget}'::text[] ELSE '{}'::text[] END
         FROM unnest($1::uuid[], $2::boolean[]) AS f(id, flag)
        WHERE p.id = f.id AND (p.over_light_budget IS DISTINCT FROM f.flag OR (f.flag <> ('over_light_budget' = ANY (p.warning_codes))))`,
      { bind: [prints.map((p) => p.id), flags], transaction: t },
    );
  }
}

/**
 * After a print's process, toning or warnings were written (print.service.ts): its effective
 * category, and its light warning kept among the warning codes.
 */
export async function storeLightDerived(printId: string, t: Transaction): Promise<void> {
  const settings = await getLightSettings(t);
  await recomputeCategories(t, [printId], settings);
  await refreshLightWarnings(t, [printId], settings);
}

// ── Light cost: ΔE00 at the most sensitive spot against cumulative exposure ──

export interface PrintLightCost {
  result: LightCostResult;
  spotLabel: string | null;
  /** The latest ΔE00 from the baseline at that spot. */
  currentDeltaE: number | null;
  threshold: number;
}

/**
 * The most sensitive spot is the one with the largest latest ΔE00 from its baseline (the spot
 * light has changed most so far); its comparable sessions from the baseline on are fitted.
 * Other sessions made on the baseline's own day are left out (the fit counts exposure in whole days).
 */
export async function lightCostOf(printId: string, periods: readonly DisplayPeriodInput[], t?: Transaction): Promise<PrintLightCost> {
  const { spots, threshold } = await printSpotChanges(printId, t);
  let best: { label: string; sessions: LightCostSession[]; latest: number } | null = null;
  for (const a of spots) {
    const latest = latestDeltaE00(a);
    if (latest === null || !a.baseline) continue;
    const base = a.baseline;
    const sessions = fittedPoints(a)
      .filter((p) => p.sessionId === base.sessionId || p.measuredOn !== base.measuredOn)
      .map((p) => ({ date: p.measuredOn, deltaE00: p.sessionId === base.sessionId ? 0 : p.dE00 }));
    if (!best || latest > best.latest) best = { label: a.spot.name, sessions, latest };
  }
  return { result: fitLightCost(best?.sessions ?? [], periods), spotLabel: best?.label ?? null, currentDeltaE: best?.latest ?? null, threshold };
}

function presentCost(c: PrintLightCost): PrintLight['cost'] {
  if (c.result.status !== 'ok') return { status: 'not_enough_data', reason: c.result.message };
  const r = c.result;
  return {
    status: 'ok', spotLabel: c.spotLabel ?? '', slopePerMlxh: r.slopePerMlxh, ci95: r.ci95, n: r.n,
    points: r.points.map((p) => ({ date: p.date, megaLuxHours: p.megaLuxHours, deltaE00: p.deltaE00 })),
    assumptions: [...r.assumptions],
  };
}

// ── A print's light dose ──

export async function printLight(printId: string, asOfGiven?: string, t?: Transaction): Promise<PrintLight> {
  const [p] = await lightPrints([printId], t);
  if (!p) throw notFound('The print');
  const settings = await getLightSettings(t);
  const asOf = asOfGiven ?? todayIso();
  const rows = await loadDisplays({ printIds: [printId] }, t);
  const periods = rows.map(periodOf);
  const category = categoryOf(p, settings);
  const status = statusOf(periods, category, settings, asOf);
  const cost = await lightCostOf(printId, periods, t);
  return {
    printId,
    category,
    categorySource: p.light_responsivity_override ? 'override' : 'default',
    defaultCategory: categoryByRules(settings, p.process, p.toner_classes),
    overrideReason: p.light_responsivity_override ? p.light_override_reason : null,
    overriddenBy: p.light_responsivity_override && p.light_override_by ? { id: p.light_override_by, name: p.override_by_name ?? '' } : null,
    budget: settings.budgets[category],
    budgetSource: settings.budgetSource,
    asOf,
    usedThisYear: status.usedThisYear,
    usedLast12Months: rollingExposure(periods, asOf),
    // Total: every day up to and including asOf; planned: the days after it.
    total: status.total,
    planned: status.scheduled,
    byYear: exposureByYear(periods),
    series: cumulativeSeries(periods),
    displays: rows.map((r) => {
      const d = presentDisplay(r);
      return { id: d.id, exhibitionId: d.exhibitionId, exhibitionTitle: d.exhibitionTitle, startsOn: d.startsOn, endsOn: d.endsOn, lux: d.lux, hoursPerDay: d.hoursPerDay, luxHours: d.luxHours };
    }),
    rest: { owedUntil: status.restOwed.owedUntil, explanation: status.restOwed.owedUntil ? status.restOwed.explanation : `${status.restOwed.explanation} ${REST_RULE}` },
    warnings: lightWarnings(status).map((w) => ({ code: w.code, message: w.message })),
    cost: presentCost(cost),
    version: p.version,
  };
}

/** A conservator's override of the default category (with a reason), or a return to the default (null). */
export async function overrideResponsivity(printId: string, body: OverrideInput, actor: Actor, requestId: string | null): Promise<PrintLight> {
  return db().transaction(async (t) => {
    const [p] = await lightPrints([printId], t, true);
    if (!p) throw notFound('The print');
    await assertPrintEditable(printId, t);
    if (p.version !== body.version) throw await staleEdit('print', printId, await printLight(printId, undefined, t), t);
    const before = { lightResponsivityOverride: p.light_responsivity_override, reason: p.light_override_reason, lightResponsivity: p.light_responsivity };
    await db().query(
      `UPDATE prints SET light_responsivity_override = $2, light_override_reason = $3, light_override_by = $4, light_override_at = CASE WHEN $2::text IS NULL THEN NULL ELSE now() END,
              version = version + 1, updated_at = now()
        WHERE id = $1`,
      { bind: [printId, body.category, body.category ? body.reason ?? null : null, body.category ? actor.id : null], transaction: t },
    );
    const settings = await getLightSettings(t);
    await recomputeCategories(t, [printId], settings);
    await refreshLightWarnings(t, [printId], settings);
    const after = await printLight(printId, undefined, t);
    await recordAudit({
      actor, action: 'print.light_responsivity_set', entityType: 'print', entityId: printId, requestId, before,
      after: { lightResponsivityOverride: body.category, reason: body.category ? body.reason ?? null : null, lightResponsivity: after.category },
    }, t);
    return after;
  });
}

/**
 * Prints whose displays, as recorded (past and scheduled), take them past their annual budget or
 * their category's maximum illuminance. Only prints with a display ending in the last 12 months
 * or later can be over, so only those are loaded; the sums are those of the pure module.
 */
export async function overBudget(): Promise<OverBudgetItem[]> {
  const asOf = todayIso();
  const settings = await getLightSettings();
  const ids = (await db().query<{ id: string }>(
    `SELECT DISTINCT print_id AS id FROM display_periods WHERE ends_on >= $1::date - 364`,
    { bind: [asOf], type: QueryTypes.SELECT },
  )).map((r) => r.id);
  const out: OverBudgetItem[] = [];
  for (let i = 0; i < ids.length; i += 500) {
    const chunk = ids.slice(i, i + 500);
    const [prints, rows] = await Promise.all([lightPrints(chunk), loadDisplays({ printIds: chunk })]);
    for (const p of prints) {
      const periods = rows.filter((r: DisplayRow) => r.print_id === p.id).map(periodOf);
      const category = categoryOf(p, settings);
      const s = statusOf(periods, category, settings, asOf);
      if (!pastBudget(s, asOf)) continue;
      out.push({
        printId: p.id, accessionNumber: p.accession_number, printTitle: p.title, category, annualLuxHours: s.annualBudget,
        usedThisYear: s.usedThisYear, planned: s.scheduled,
        warnings: lightWarnings(s).map((w) => ({ code: w.code, message: w.message })),
      });
    }
  }
  return out.sort((a, b) => a.accessionNumber.localeCompare(b.accessionNumber, 'en', { numeric: true }));
}
