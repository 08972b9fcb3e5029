import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { catalogueSettingsSchema, printInputSchema, recipeInputSchema, stepsReplaceSchema } from '@toneledger/common/schemas/catalogue';
import { addendumInputSchema, reportInputSchema } from '@toneledger/common/schemas/condition';
import { limitsOf, schemaAt } from '@/lib/forms/limits';

describe('limits read from the contract', () => {
  it('reads text lengths through optional, nullable and preprocess wrappers', () => {
    expect(limitsOf(printInputSchema, 'accessionNumber')).toEqual({ maxLength: 60, minLength: 1 });
    expect(limitsOf(printInputSchema, 'title').maxLength).toBe(500);
    expect(limitsOf(printInputSchema, 'staffNotes').maxLength).toBe(10000);
    expect(limitsOf(printInputSchema, 'creditLine').maxLength).toBe(500);
    expect(limitsOf(catalogueSettingsSchema, 'institutionName')).toEqual({ maxLength: 300, minLength: 1 });
    expect(limitsOf(addendumInputSchema, 'text').maxLength).toBe(10000);
  });

  it('reads inside arrays and objects by dotted path, with indexes', () => {
    expect(limitsOf(stepsReplaceSchema, 'steps.3.notes').maxLength).toBe(2000);
    expect(limitsOf(stepsReplaceSchema, 'steps.0.dilution').maxLength).toBe(50);
    expect(limitsOf(reportInputSchema, 'observations.1.notes').maxLength).toBe(2000);
    expect(limitsOf(recipeInputSchema, 'ingredients.0.chemical').maxLength).toBe(200);
  });

  it('reads number ranges', () => {
    expect(limitsOf(printInputSchema, 'imageWidthMm')).toEqual({ min: 0, max: 5000 });
    expect(limitsOf(stepsReplaceSchema, 'steps.0.temperatureC')).toEqual({ min: -10, max: 100 });
    expect(limitsOf(z.object({ n: z.number().int().min(1).max(9).default(3) }), 'n')).toEqual({ min: 1, max: 9 });
  });

  it('gives nothing for a path the schema does not have, or a field without limits', () => {
    expect(limitsOf(printInputSchema, 'colour')).toEqual({});
    expect(limitsOf(printInputSchema, 'process')).toEqual({});
    expect(schemaAt(printInputSchema, 'title.x')).toBeUndefined();
    expect(limitsOf(z.object({ s: z.string() }), 's')).toEqual({ maxLength: undefined, minLength: undefined });
  });
});
