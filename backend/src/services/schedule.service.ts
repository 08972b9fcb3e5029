import { QueryTypes, type Transaction } from 'sequelize';
import { z } from 'zod';
import { assessPrint, explain, RISK_RANK } from '@toneledger/common/domain/inspection-risk';
import type { PrintSchedule, RiskFactor, scheduleOverrideInputSchema } from '@toneledger/common/schemas/inspections';
import { db } from '../db';
import { notFound } from '../errors';
import { recordAudit } from './audit.service';
import { assertPrintEditable } from './print-lock';
import { todayIso } from './display-rows';
import type { Actor } from './print.service';
import { loadRiskInputs } from './schedule-inputs';
import type { SpotAnalyses } from './spot-histories';
import { staleEdit } from './versioning';

/**
 * Each print's next-inspection date in `print_schedules`: computed by the risk model
 * (common/src/domain/inspection-risk.ts) from the inputs `schedule-inputs.ts` loads, kept with a
 * conservator's override (`due_on` = the override, else the computed date). The marks of
 * `schedule-stale.ts` and the full recompute (`schedule-jobs.ts`) call `recomputeSchedules`.
 */

/**
 * Computes the batch's schedules and writes them in one statement. A row keeps its override; its
 * version moves only when something a person reads changed (date, interval, risk, factors, last check).
 * Returns how many prints were written.
 */
export async function recomputeSchedules(allIds: readonly string[], t?: Transaction, asOf = todayIso(), spots?: SpotAnalyses): Promise<number> {
  if (!allIds.length) return 0;
  // A deaccessioned print has left the collection: it is no longer inspected, so it has no date
  // (its row, if any, goes, and with it the print's place on the work list, digests and calendars).
  const gone = new Set((await db().query<{ id: string }>(
    `WITH gone AS (SELECT id FROM prints WHERE id = ANY ($1::uuid[]) AND status = 'deaccessioned'),
          dropped AS (DELETE FROM print_schedules s USING gone WHERE s.print_id = gone.id)
     SELECT id FROM gone`,
    { bind: [allIds], transaction: t, type: QueryTypes.SELECT },
  )).map((r) => r.id));
  const ids = gone.size ? allIds.filter((id) => !gone.has(id)) : allIds;
  if (!ids.length) return 0;
  const inputs = await loadRiskInputs(ids, asOf, t, spots);
  const rows = [...inputs.entries()].map(([printId, input]) => {
    const r = assessPrint(input);
    return {
      print_id: printId, computed_due_on: r.dueOn, interval_months: r.intervalMonths, risk: r.risk, risk_rank: RISK_RANK[r.risk],
      factors: r.factors,
      // Factor codes are plain identifiers: an array literal is safe here.
      reasons: `{${[...new Set(r.factors.map((f) => f.code))].join(',')}}`,
      main_reason: r.factors[0]?.text ?? '', last_checked_on: input.lastCheckedOn,
    };
  });
  if (!rows.length) return 0;
  await db().query(
    `INSERT INTO print_schedules AS s (print_id, computed_due_on, due_on, interval_months, risk, risk_rank, factors, reasons, main_reason, last_checked_on, computed_at)
     SELECT x.print_id, x.computed_due_on, x.computed_due_on, x.interval_months, x.risk, x.risk_rank,
            x.factors, x.reasons::text[], x.main_reason, x.last_checked_on, now()
       FROM jsonb_to_recordset($1::jsonb) AS x(print_id uuid, computed_due_on date, interval_months numeric, risk text, risk_rank smallint,
                                                factors jsonb, reasons text, main_reason text, last_checked_on date)
     ON CONFLICT (print_id) DO UPDATE SET
       computed_due_on = EXCLUDED.computed_due_on,
       due_on = coalesce(s.override_due_on, EXCLUDED.computed_due_on),
       interval_months = EXCLUDED.interval_months, risk = EXCLUDED.risk, risk_rank = EXCLUDED.risk_rank, factors = EXCLUDED.factors,
       reasons = EXCLUDED.reasons, main_reason = EXCLUDED.main_reason, last_checked_on = EXCLUDED.last_checked_on, computed_at = now(),
       version = s.version + CASE WHEN (s.computed_due_on, s.interval_months, s.risk, s.factors, s.last_checked_on)
                                   IS DISTINCT FROM (EXCLUDED.computed_due_on, EXCLUDED.interval_months, EXCLUDED.risk, EXCLUDED.factors, EXCLUDED.last_checked_on)
                                  THEN 1 ELSE 0 END`,
    { bind: [JSON.stringify(rows)], transaction: t, type: QueryTypes.INSERT },
  );
  return rows.length;
}

interface ScheduleRow {
  print_id: string;
  due_on: string;
  computed_due_on: string;
  interval_months: string | number;
  risk: PrintSchedule['risk'];
  factors: RiskFactor[];
  last_checked_on: string | null;
  override_due_on: string | null;
  override_reason: string | null;
  overridden_by: string | null;
  overridden_by_name: string | null;
  overridden_at: Date | null;
  computed_at: Date;
  version: number;
  rounds: { id: string; title: string; plannedOn: string }[];
}

async function scheduleRow(printId: string, t?: Transaction, lock = false): Promise<ScheduleRow | null> {
  if (lock) await db().query('SELECT 1 FROM print_schedules WHERE print_id = $1 FOR UPDATE', { bind: [printId], transaction: t, type: QueryTypes.SELECT });
  const [row] = await db().query<ScheduleRow>(
    `SELECT s.print_id, s.due_on::text AS due_on, s.computed_due_on::text AS computed_due_on, s.interval_months, s.risk, s.factors,
            s.last_checked_on::text AS last_checked_on, s.override_due_on::text AS override_due_on, s.override_reason, s.overridden_by,
            u.name AS overridden_by_name, s.overridden_at, s.computed_at, s.version,
            coalesce((SELECT json_agg(json_build_object('id', r.id, 'title', r.title, 'plannedOn', r.planned_on::text) ORDER BY r.planned_on, r.id)
                        FROM inspection_round_items i JOIN inspection_rounds r ON r.id = i.round_id
                       WHERE i.print_id = s.print_id AND r.status = 'planned'), '[]') AS rounds
       FROM print_schedules s LEFT JOIN users u ON u.id = s.overridden_by
      WHERE s.print_id = $1`,
    { bind: [printId], transaction: t, type: QueryTypes.SELECT },
  );
  return row ?? null;
}

function presentSchedule(r: ScheduleRow): PrintSchedule {
  const computed = explain(r.computed_due_on, r.factors);
  const explanation = r.override_due_on ? `due ${r.due_on.slice(0, 7)}: set by a conservator (${r.override_reason ?? ''}); computed ${computed}` : computed;
  return {
    printId: r.print_id, dueOn: r.due_on, computedDueOn: r.computed_due_on, intervalMonths: Number(r.interval_months), risk: r.risk,
    factors: r.factors, explanation, lastCheckedOn: r.last_checked_on,
    override: r.override_due_on && r.overridden_by && r.overridden_at
      ? { dueOn: r.override_due_on, reason: r.override_reason ?? '', by: { id: r.overridden_by, name: r.overridden_by_name ?? '' }, at: r.overridden_at.toISOString() }
      : null,
    computedAt: r.computed_at.toISOString(), rounds: r.rounds, version: r.version,
  };
}

async function requirePrint(printId: string, t?: Transaction): Promise<void> {
  const [p] = await db().query('SELECT 1 FROM prints WHERE id = $1', { bind: [printId], transaction: t, type: QueryTypes.SELECT });
  if (!p) throw notFound('The print');
}

/** A print's schedule; computed and stored on the spot when the print has none yet. */
export async function printSchedule(printId: string, t?: Transaction): Promise<PrintSchedule> {
  // 409 naming the day for a deaccessioned print (no longer inspected), 404 for no print.
  await assertPrintEditable(printId, t);
  let row = await scheduleRow(printId, t);
  if (!row) {
    await requirePrint(printId, t);
    await recomputeSchedules([printId], t);
    row = await scheduleRow(printId, t);
    if (!row) throw notFound('The print');
  }
  return presentSchedule(row);
}

type OverrideInput = z.infer<typeof scheduleOverrideInputSchema>;

/** A conservator's own date with a reason, or (dueOn null) back to the computed date: version-checked and audited. */
export async function overrideSchedule(printId: string, body: OverrideInput, actor: Actor, requestId: string | null): Promise<PrintSchedule> {
  await printSchedule(printId); // make the row first when there is none (its version is then 1)
  return db().transaction(async (t) => {
    const row = await scheduleRow(printId, t, true);
    if (!row) throw notFound('The print');
    await assertPrintEditable(printId, t);
    if (row.version !== body.version) throw await staleEdit('print_schedule', printId, presentSchedule(row), t);
    const reason = body.dueOn ? body.reason ?? null : null;
    await db().query(
      `UPDATE print_schedules SET override_due_on = $2::date, override_reason = $3, overridden_by = $4, overridden_at = CASE WHEN $2::date IS NULL THEN NULL ELSE now() END,
              due_on = coalesce($2::date, computed_due_on), version = version + 1
        WHERE print_id = $1`,
      { bind: [printId, body.dueOn, reason, body.dueOn ? actor.id : null], transaction: t },
    );
    const after = await scheduleRow(printId, t);
    await recordAudit({
      actor, action: body.dueOn ? 'print_schedule.overridden' : 'print_schedule.override_cleared', entityType: 'print_schedule', entityId: printId, requestId,
      before: { dueOn: row.due_on, overrideDueOn: row.override_due_on, reason: row.override_reason },
      after: { dueOn: after!.due_on, overrideDueOn: body.dueOn, reason },
    }, t);
    return presentSchedule(after!);
  });
}
