import type { ProcessStep } from '@toneledger/common/schemas/catalogue';
import { STEP_TYPE, TONER_CLASS, type STEP_TYPE as StepTypes } from '@toneledger/common/schemas/vocab';
import { formatDuration } from '@toneledger/common/domain/duration';

export type StepType = (typeof StepTypes.codes)[number];

/**
 * One step as the editor holds it: every field as the text in its control, named as in the
 * contract. `timeSeconds` holds the time as typed (m:ss or seconds); the contract reads it.
 */
export interface StepValues {
  type: StepType;
  agent: string;
  tonerClass: string;
  recipeId: string;
  dilution: string;
  timeSeconds: string;
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

export interface StepsValues {
  steps: StepValues[];
}

export type StepField = Exclude<keyof StepValues, 'type'>;

const BATH: StepField[] = ['agent', 'dilution', 'timeSeconds', 'temperatureC', 'notes'];

/** Which fields each kind of step records. Fields of other kinds are never sent. */
export const FIELDS_BY_KIND: Record<StepType, StepField[]> = {
  development: BATH,
  stop: BATH,
  fixing: BATH,
  washing: BATH,
  hypo_clearing: BATH,
  final_wash: BATH,
  toning: ['tonerClass', 'recipeId', 'agent', 'dilution', 'timeSeconds', 'temperatureC', 'extent', 'notes'],
  after_bath: ['agent', 'concentration', 'timeSeconds', 'temperatureC', 'alkaline', 'notes'],
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

export function emptyStep(type: StepType): StepValues {
  return {
    type, agent: '', tonerClass: '', recipeId: '', dilution: '', timeSeconds: '', temperatureC: '', extent: '',
    concentration: '', alkaline: 'unknown', method: '', value: '', unit: '', notes: '',
  };
}

const text = (value: string | number | null | undefined) => (value === null || value === undefined ? '' : String(value));

export function stepToValues(step: ProcessStep): StepValues {
  return {
    type: step.type,
    agent: text(step.agent),
    tonerClass: text(step.tonerClass),
    recipeId: step.recipe?.id ?? '',
    dilution: text(step.dilution),
    timeSeconds: formatDuration(step.timeSeconds),
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

/** The print's steps in their order, as the editor holds them. */
export function printToStepsValues(print: { steps: ProcessStep[] }): StepsValues {
  return { steps: [...print.steps].sort((a, b) => a.position - b.position).map(stepToValues) };
}

const CHOICES: StepField[] = ['tonerClass', 'extent', 'method'];

/**
 * A step as the request carries it: only the fields of its kind; an empty choice is null and the
 * alkaline choice is true, false or null. Text and figures go as typed, for the schema to read.
 */
export function stepToBody(step: StepValues): Record<string, unknown> {
  const out: Record<string, unknown> = { type: step.type };
  for (const field of FIELDS_BY_KIND[step.type]) {
    const value = step[field];
    if (field === 'alkaline') out.alkaline = value === 'yes' ? true : value === 'no' ? false : null;
    else out[field] = CHOICES.includes(field) && value === '' ? null : value;
  }
  return out;
}

/** Where a problem at a path of the request shows: a step as a whole shows at its type. */
export function stepFieldFor(path: string): string {
  if (/^steps\.\d+$/.test(path)) return `${path}.type`;
  return path.startsWith('steps.') ? path : '';
}

/** A step in one line: "Toning — Iron blue (Recipe name) — agent". */
export function describeStep(step: StepValues, recipeName: (id: string) => string | undefined): string {
  const toner = step.tonerClass ? ` — ${TONER_CLASS.labels[step.tonerClass as keyof typeof TONER_CLASS.labels] ?? step.tonerClass}` : '';
  const recipe = step.recipeId ? ` (${recipeName(step.recipeId) ?? 'a recipe'})` : '';
  const agent = step.agent.trim() ? ` — ${step.agent.trim()}` : '';
  return `${STEP_TYPE.labels[step.type]}${toner}${recipe}${agent}`;
}
