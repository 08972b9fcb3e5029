import type { Transaction } from 'sequelize';
import { QueryTypes } from 'sequelize';
import type { LightSettings } from '@toneledger/common/schemas/light';
import { DEFAULT_LIGHT_SETTINGS } from '@toneledger/common/domain/light-rules';
import { Setting } from '../models';
import { db } from '../db';
import { categorySql } from './light-category-sql';

export { categorySql };

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
