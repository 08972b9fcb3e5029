import {
  stepsReplaceSchema,
  type ProcessStep,
  type ProcessStepInput,
} from '@toneledger/common/schemas/catalogue';
import type { STEP_TYPE } from '@toneledger/common/schemas/vocab';
import { formatSeconds, parseTimeInput } from '@/features/catalogue/utils/format';

export type StepType = (typeof STEP_TYPE.codes)[number];

/** One step as the editor holds it: every field as the text in its control. */
export interface StepDraft {
  key: string;
  type: StepType;
  agent: string;
  tonerClass: string;
  recipeId: string;
  dilution: string;
  time: string;
  temperatureC: string;
  extent: string;
  concentration: string;
  /** 'yes' | 'no' | 'unknown' */
  alkaline: string;
  method: string;
  value: string;
  unit: string;
  notes: string;
}

export type StepField = Exclude<keyof StepDraft, 'key' | 'type'>;

const BATH: StepField[] = ['agent', 'dilution', 'time', 'temperatureC', 'notes'];

/** Which fields each kind of step records. Fields of other kinds are never sent. */
export const STEP_FIELDS: Record<StepType, StepField[]> = {
  development: BATH,
  stop: BATH,
  fixing: BATH,
  washing: BATH,
  hypo_clearing: BATH,
  final_wash: BATH,
  toning: ['tonerClass', 'recipeId', 'agent', 'dilution', 'time', 'temperatureC', 'extent', 'notes'],
  after_bath: ['agent', 'concentration', 'time', 'temperatureC', 'alkaline', 'notes'],
  residual_thiosulfate_test: ['method', 'value', 'unit', 'notes'],
};

/** What the free-text agent is called for each kind of step. */
export const AGENT_LABELS: Record<StepType, string> = {
  development: 'Developer',
  stop: 'Stop bath',
  fixing: 'Fixer',
  washing: 'Wash',
  hypo_clearing: 'Clearing agent',
  final_wash: 'Wash',
  toning: 'Toner as used',
  after_bath: 'Solution',
  residual_thiosulfate_test: 'Agent',
};

let counter = 0;
export function newStepKey(): string {
  counter += 1;
  return `step-${counter}`;
}

export function emptyStep(type: StepType): StepDraft {
  return {
    key: newStepKey(), type, agent: '', tonerClass: '', recipeId: '', dilution: '', time: '', temperatureC: '', extent: '',
    concentration: '', alkaline: 'unknown', method: '', value: '', unit: '', notes: '',
  };
}

const text = (value: string | number | null | undefined) => (value === null || value === undefined ? '' : String(value));

export function stepToDraft(step: ProcessStep): StepDraft {
  return {
    key: step.id,
    type: step.type,
    agent: text(step.agent),
    tonerClass: text(step.tonerClass),
    recipeId: step.recipe?.id ?? '',
    dilution: text(step.dilution),
    time: formatSeconds(step.timeSeconds),
    temperatureC: text(step.temperatureC),
    extent: text(step.extent),
    concentration: text(step.concentration),
    alkaline: step.alkaline === true ? 'yes' : step.alkaline === false ? 'no' : 'unknown',
    method: text(step.method),
    value: text(step.value),
    unit: text(step.unit),
    notes: text(step.notes),
  };
}

/** A draft as the API receives it: only the fields of its kind, empty as null, time in seconds. */
export function draftToInput(draft: StepDraft): Record<string, unknown> {
  const out: Record<string, unknown> = { type: draft.type };
  for (const field of STEP_FIELDS[draft.type]) {
    const value = draft[field];
    if (field === 'time') out.timeSeconds = parseTimeInput(value);
    else if (field === 'alkaline') out.alkaline = value === 'yes' ? true : value === 'no' ? false : null;
    else out[field] = value.trim() === '' ? null : value;
  }
  return out;
}

/** Error keys are `<index>.<field>` (the editor's field names: `time` for `timeSeconds`), or `form`. */
export type StepErrors = Partial<Record<string, string>>;

function stepErrorKey(path: readonly PropertyKey[]): string {
  // steps.2.timeSeconds → 2.time
  const [root, index, field] = path.map(String);
  if (root !== 'steps' || index === undefined) return 'form';
  if (field === undefined) return `${index}.type`;
  return `${index}.${field === 'timeSeconds' ? 'time' : field}`;
}

export function issuesToStepErrors(issues: { path: string | readonly PropertyKey[]; message: string }[]): StepErrors {
  const errors: StepErrors = {};
  for (const issue of issues) {
    const path = typeof issue.path === 'string' ? issue.path.split('.').filter(Boolean) : issue.path;
    const key = stepErrorKey(path);
    errors[key] ??= issue.message;
  }
  return errors;
}

export type CheckedSteps = { ok: true; data: { version: number; steps: ProcessStepInput[] } } | { ok: false; errors: StepErrors };

/** The whole list checked with the schema the server uses. */
export function checkSteps(drafts: StepDraft[], version: number): CheckedSteps {
  const result = stepsReplaceSchema.safeParse({ version, steps: drafts.map(draftToInput) });
  if (result.success) return { ok: true, data: result.data };
  return { ok: false, errors: issuesToStepErrors(result.error.issues) };
}

/** Moves the item at `from` by `delta` places; out-of-range moves leave the list as it is. */
export function moveItem<T>(items: T[], from: number, delta: number): T[] {
  const to = from + delta;
  if (from < 0 || from >= items.length || to < 0 || to >= items.length) return items;
  const next = [...items];
  const [item] = next.splice(from, 1);
  next.splice(to, 0, item as T);
  return next;
}
