import { describe, expect, it } from 'vitest';
import { formatDuration, parseDuration } from './duration';

describe('bath times', () => {
  it('reads m:ss and whole seconds, and nothing else', () => {
    expect(parseDuration('1:30')).toBe(90);
    expect(parseDuration(' 75:00 ')).toBe(4500);
    expect(parseDuration('90')).toBe(90);
    expect(parseDuration('')).toBeNull();
    expect(parseDuration('   ')).toBeNull();
    expect(parseDuration('1:75')).toBeUndefined();
    expect(parseDuration('two minutes')).toBeUndefined();
    expect(parseDuration('1.5')).toBeUndefined();
    expect(parseDuration('-30')).toBeUndefined();
  });

  it('writes m:ss, minutes past 59 included', () => {
    expect(formatDuration(90)).toBe('1:30');
    expect(formatDuration(4500)).toBe('75:00');
    expect(formatDuration(5)).toBe('0:05');
    expect(formatDuration(null)).toBe('');
  });
});
