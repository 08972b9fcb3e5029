import type { Transaction } from 'sequelize';
import { QueryTypes } from 'sequelize';
import type { LightSettings } from '@toneledger/common/schemas/light';
import { DEFAULT_LIGHT_SETTINGS } from '@toneledger/common/domain/light-rules';
import { Setting } from '../models';
import { db } from '../db';

/**
 * The light settings (budgets per category with their source, the default category rules, the
 * fallback), stored like the other settings sections; a collection starts from the pure module's
 * defaults. Changing the rules recomputes every print's effective category in one statement and
 * the light warnings of the prints with display periods.
 */

const KEY = 'light';

export async function getLightSettings(transaction?: Transaction): Promise<LightSettings> {
  const row = await Setting.findByPk(KEY, { transaction });
  return { ...DEFAULT_LIGHT_SETTINGS, ...((row?.value as Partial<LightSettings> | undefined) ?? {}) };
}

/**
 * The SQL expression of a print's effective category (alias `p`): the override, else the first
 * rule that matches, else the fallback. Rule values are bound, never written into the text.
 */
export function categorySql(settings: LightSettings, bind: unknown[]): string {
  const arg = (v: unknown) => {
    bind.push(v);
    return `$${bind.length}`;
  };
  const whens = settings.rules.map((r) => {
    const conds = [
      r.process != null ? `p.process = ${arg(r.process)}` : null,
      r.tonerClass != null ? `${arg(r.tonerClass)}::text = ANY (p.toner_classes)` : null,
    ].filter(Boolean);
    return `WHEN ${conds.length ? conds.join(' AND ') : 'true'} THEN ${arg(r.category)}::text`;
  });
  const def = `CASE ${whens.join(' ')} ELSE ${arg(settings.fallbackCategory)}::text END`;
  return `coalesce(p.light_responsivity_override, ${def})`;
}

/**
 * Writes the effective category of every print (or of the prints named) in one UPDATE, touching
 * only rows whose category changes. Returns how many changed.
 */
export async function recomputeCategories(t: Transaction, printIds?: readonly string[], settings?: LightSettings): Promise<number> {
  const s = settings ?? (await getLightSettings(t));
  const bind: unknown[] = [];
  const expr = categorySql(s, bind);
  let where = `p.light_responsivity IS DISTINCT FROM ${expr}`;
  if (printIds) {
    if (printIds.length === 0) return 0;
    bind.push(printIds);
    where += ` AND p.id = ANY ($${bind.length}::uuid[])`;
  }
  const [, count] = (await db().query(`UPDATE prints p SET light_responsivity = ${expr} WHERE ${where}`, {
    bind, transaction: t, type: QueryTypes.UPDATE,
  })) as unknown as [unknown, number];
  return count;
}
