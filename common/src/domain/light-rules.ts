/**
 * The light settings' form of the default category rules: an ordered list, the first rule whose
 * process and toner class match giving the category, else the fallback. The defaults are those of
 * `light-budget.ts` (DEFAULT_RESPONSIVITY_RULES: the most responsive of the process's category and
 * each toner class's), written as a list ordered from the most responsive category down, which
 * gives the same answer: the first match is the highest category any part of the print calls for.
 */
import type { LightSettings } from '../schemas/light';
import {
  DEFAULT_LIGHT_BUDGETS, DEFAULT_RESPONSIVITY_RULES, LIGHT_BUDGET_SOURCE, LIGHT_CATEGORIES, type LightCategory, type ResponsivityRules,
} from './light-budget';

type Rule = LightSettings['rules'][number];

/** The ordered rule list equivalent to a process/toner table (most responsive category first). */
export function rulesFromTable(table: ResponsivityRules): Rule[] {
  const out: Rule[] = [];
  for (const category of [...LIGHT_CATEGORIES].reverse()) {
    for (const [tonerClass, c] of Object.entries(table.toner)) if (c === category) out.push({ tonerClass: tonerClass as Rule['tonerClass'], category });
    for (const [process, c] of Object.entries(table.process)) if (c === category) out.push({ process: process as Rule['process'], category });
  }
  return out;
}

/** The settings a collection starts from. */
export const DEFAULT_LIGHT_SETTINGS: LightSettings = {
  budgets: { ...DEFAULT_LIGHT_BUDGETS },
  budgetSource: LIGHT_BUDGET_SOURCE,
  rules: rulesFromTable(DEFAULT_RESPONSIVITY_RULES),
  fallbackCategory: DEFAULT_RESPONSIVITY_RULES.fallback,
};

/** Does a rule apply to a print of this process and toning? */
export function ruleMatches(rule: Rule, process: string, tonerClasses: readonly string[]): boolean {
  return (rule.process == null || rule.process === process) && (rule.tonerClass == null || tonerClasses.includes(rule.tonerClass));
}

/** The default category of a print under the settings' rules. */
export function categoryByRules(settings: Pick<LightSettings, 'rules' | 'fallbackCategory'>, process: string, tonerClasses: readonly string[]): LightCategory {
  return settings.rules.find((r) => ruleMatches(r, process, tonerClasses))?.category ?? settings.fallbackCategory;
}
