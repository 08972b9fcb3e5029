import { LIGHT_CATEGORIES } from '@toneledger/common/domain/light-budget';
import { LIGHT_RESPONSIVITY, PROCESS, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import type { LightSettings } from '@toneledger/common/schemas/light';

type Category = (typeof LIGHT_CATEGORIES)[number];

/** What the settings form's controls hold: numbers as typed, '' for "no limit" or "any". */
export interface LightSettingsValues {
  budgets: Record<Category, { maxLux: string; annualLuxHours: string }>;
  budgetSource: string;
  rules: { process: string; tonerClass: string; category: string }[];
  fallbackCategory: string;
}

const text = (n: number | null) => (n === null ? '' : String(n));

export function lightSettingsToValues(s: LightSettings): LightSettingsValues {
  const budgets = Object.fromEntries(
    LIGHT_CATEGORIES.map((c) => [c, { maxLux: text(s.budgets[c].maxLux), annualLuxHours: text(s.budgets[c].annualLuxHours) }]),
  ) as LightSettingsValues['budgets'];
  return {
    budgets,
    budgetSource: s.budgetSource,
    rules: s.rules.map((r) => ({ process: r.process ?? '', tonerClass: r.tonerClass ?? '', category: r.category })),
    fallbackCategory: s.fallbackCategory,
  };
}

/**
 * A typed figure as the schema should see it: empty is null (no limit), a plain number is that
 * number, anything else is passed on as typed so the schema refuses it ("Enter a number") rather
 * than the form quietly dropping it.
 */
export function typedFigure(value: string): number | string | null {
  const trimmed = value.trim();
  if (trimmed === '') return null;
  const n = Number(trimmed);
  return Number.isFinite(n) ? n : value;
}

/** Values → the settings body: figures as numbers, "any" as null. */
export function lightSettingsValuesToBody(v: LightSettingsValues) {
  return {
    budgets: Object.fromEntries(
      LIGHT_CATEGORIES.map((c) => [c, { maxLux: typedFigure(v.budgets[c].maxLux), annualLuxHours: typedFigure(v.budgets[c].annualLuxHours) }]),
    ),
    budgetSource: v.budgetSource,
    rules: v.rules.map((r) => ({ process: r.process || null, tonerClass: r.tonerClass || null, category: r.category })),
    fallbackCategory: v.fallbackCategory,
  };
}

const FIELD_LABELS: Record<string, string> = { process: 'Process', tonerClass: 'Toner', category: 'Category', maxLux: 'Maximum illuminance', annualLuxHours: 'Annual exposure' };

/** The error summary's name for a field inside a row: "Rule 2 · Category", "High · Annual exposure". */
export function settingsLabelFor(path: string, label: string | null): string | null {
  const rule = /^rules\.(\d+)\.(\w+)$/.exec(path);
  if (rule) return `Rule ${Number(rule[1]) + 1} · ${FIELD_LABELS[rule[2]!] ?? rule[2]}`;
  const budget = /^budgets\.(\w+)\.(\w+)$/.exec(path);
  if (budget) return `${(LIGHT_RESPONSIVITY.labels as Record<string, string>)[budget[1]!] ?? budget[1]} · ${FIELD_LABELS[budget[2]!] ?? budget[2]}`;
  return label;
}

export const PROCESS_OPTIONS = PROCESS.options;
export const TONER_OPTIONS = TONER_CLASS.options;
export const CATEGORY_OPTIONS = LIGHT_RESPONSIVITY.options;
