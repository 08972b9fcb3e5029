import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { catalogueSettingsSchema, makerInputSchema, printInputSchema, processStepInputSchema } from './catalogue';
import { reportInputSchema } from './condition';
import { productMessage } from './messages';

/** The messages a schema gives for a value, by path. */
function messages(schema: z.ZodType, value: unknown): Record<string, string[]> {
  const result = schema.safeParse(value);
  const out: Record<string, string[]> = {};
  if (!result.success) for (const issue of result.error.issues) (out[issue.path.join('.')] ??= []).push(issue.message);
  return out;
}

const print = { accessionNumber: '1987.14.3', title: 'Pier at dusk', process: 'cyanotype' };

describe('zod messages in the product’s words', () => {
  it('a valuation typed in words asks for a number', () => {
    expect(messages(printInputSchema, { ...print, valuationAmount: 'ten thousand' })).toEqual({ valuationAmount: ['Enter a number'] });
  });

  it('empty catalogue settings are required, once each', () => {
    expect(messages(catalogueSettingsSchema, { accessionPattern: '', institutionName: '  ' })).toEqual({
      accessionPattern: ['Required'],
      institutionName: ['Required'],
    });
    expect(messages(catalogueSettingsSchema, {})).toEqual({ accessionPattern: ['Required'], institutionName: ['Required'] });
  });

  it('gives limits in words, from the schema', () => {
    expect(messages(catalogueSettingsSchema, { accessionPattern: 'N', institutionName: 'x'.repeat(301) })).toEqual({ institutionName: ['At most 300 characters'] });
    expect(messages(z.number().min(1), 0)).toEqual({ '': ['At least 1'] });
    expect(messages(z.number().gt(0), 0)).toEqual({ '': ['More than 0'] });
    expect(messages(z.number().lt(5), 5)).toEqual({ '': ['Less than 5'] });
    expect(messages(z.number().max(1_000_000), 2_000_000)).toEqual({ '': ['At most 1,000,000'] });
    expect(messages(z.string().min(3), 'ab')).toEqual({ '': ['At least 3 characters'] });
    expect(messages(z.array(z.string()).min(1), [])).toEqual({ '': ['Add at least one'] });
    expect(messages(z.array(z.string()).max(2), ['a', 'b', 'c'])).toEqual({ '': ['At most 2 items'] });
  });

  it('asks to choose from the list for a value outside an enumeration', () => {
    expect(messages(printInputSchema, { ...print, process: 'daguerreotype' })).toEqual({ process: ['Choose one of the listed values'] });
  });

  it('refuses a date that does not exist with one message', () => {
    expect(messages(z.object({ on: z.iso.date() }), { on: '2024-02-31' })).toEqual({ on: ['Enter a real date, as YYYY-MM-DD'] });
    expect(messages(z.object({ on: z.iso.date() }), { on: '2024-02-29' })).toEqual({});
    expect(messages(reportInputSchema, { examinedOn: '2024-02-31', context: 'routine', nextCheckOn: '2025-13-01' })).toEqual({
      examinedOn: ['Enter a real date, as YYYY-MM-DD'],
      nextCheckOn: ['Enter a real date, as YYYY-MM-DD'],
    });
  });

  it('words wrong types and missing values plainly', () => {
    expect(messages(z.object({ n: z.number() }), { n: 'x' })).toEqual({ n: ['Enter a number'] });
    expect(messages(z.object({ n: z.number().int() }), { n: 1.5 })).toEqual({ n: ['Enter a whole number'] });
    expect(messages(z.object({ s: z.string() }), {})).toEqual({ s: ['Required'] });
    expect(messages(z.object({ b: z.boolean() }), { b: 'yes' })).toEqual({ b: ['Choose yes or no'] });
    expect(messages(z.string().email(), 'desk')).toEqual({ '': ['Enter an e-mail address'] });
  });

  it('never replaces a schema’s own message', () => {
    expect(messages(makerInputSchema, { name: '' })).toEqual({ name: ['Enter a name'] });
    expect(messages(printInputSchema, { ...print, imageWidthMm: 'wide' })).toEqual({ imageWidthMm: ['Enter a number of millimetres'] });
  });

  it('reads a step time as m:ss or seconds, and says so when it is neither', () => {
    const step = (timeSeconds: unknown) => processStepInputSchema.safeParse({ type: 'development', timeSeconds });
    expect(step('1:30').data?.timeSeconds).toBe(90);
    expect(step('90').data?.timeSeconds).toBe(90);
    expect(step('').data?.timeSeconds).toBeNull();
    expect(step(45).data?.timeSeconds).toBe(45);
    const hint = 'Enter a time as m:ss or seconds, e.g. 1:30 or 90';
    expect(messages(processStepInputSchema, { type: 'development', timeSeconds: 'two minutes' })).toEqual({ timeSeconds: [hint] });
    expect(messages(processStepInputSchema, { type: 'development', timeSeconds: '1:75' })).toEqual({ timeSeconds: [hint] });
  });

  it('has a plain word for every kind of issue', () => {
    const raw = (issue: Record<string, unknown>) => productMessage({ input: undefined, path: [], ...issue } as never);
    expect(raw({ code: 'unrecognized_keys', keys: ['colour'] })).toBe('Not a field of this record: colour');
    expect(raw({ code: 'custom' })).toBe('Check this value');
    expect(raw({ code: 'invalid_union', errors: [] })).toBe('Not a value this field takes');
    expect(raw({ code: 'not_multiple_of', divisor: 5 })).toBe('Must be a multiple of 5');
    expect(raw({ code: 'invalid_format', format: 'regex', pattern: '/x/' })).toBe('Not in the expected form');
  });
});
