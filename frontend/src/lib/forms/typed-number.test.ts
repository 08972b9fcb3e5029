import { describe, expect, it } from 'vitest';
import { displayInputSchema } from '@toneledger/common/schemas/exhibitions';
import { typedNumber } from '@/lib/forms/typed-number';

describe('typedNumber', () => {
  it('reads empty as not given and figures as numbers, a decimal comma too (common practice in many locales)', () => {
    expect(typedNumber('')).toBeNull();
    expect(typedNumber('   ')).toBeNull();
    expect(typedNumber('50')).toBe(50);
    expect(typedNumber(' 7.5 ')).toBe(7.5);
    expect(typedNumber('7,5')).toBe(7.5);
  });

  it('hands text that is no number to the schema unchanged, which answers "Enter a number"', () => {
    expect(typedNumber('fifty')).toBe('fifty');
    const parsed = displayInputSchema.safeParse({
      printId: '8b2f1d63-5a2c-4d0f-9e3b-2c3d4e5f6a73', startsOn: '2026-04-01', endsOn: '2026-04-02', lux: typedNumber('fifty'), hoursPerDay: 8,
    });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.find((i) => i.path[0] === 'lux')?.message).toBe('Enter a number');
  });
});
