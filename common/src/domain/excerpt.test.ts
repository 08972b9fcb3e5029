import { describe, expect, it } from 'vitest';
import { excerpt } from './excerpt';

describe('excerpt: whole words, then an ellipsis', () => {
  const addendum =
    'On re-examination under raking light the cockling along the lower edge is more pronounced than recorded; ' +
    'the emulsion shows fine crazing in the dark sky area, and silver mirroring has extended about 4 mm inward.';

  it('never cuts a word in half and marks the cut', () => {
    const short = excerpt(addendum, 60);
    expect(short.endsWith('…')).toBe(true);
    expect(short.length).toBeLessThanOrEqual(61);
    const words = short.slice(0, -1).split(' ');
    // every word of the excerpt is a whole word of the text, in order
    expect(addendum.startsWith(words.join(' '))).toBe(true);
    expect(addendum.charAt(short.length - 1)).toMatch(/[\s;,]/);
    expect(short).toBe('On re-examination under raking light the cockling along the…');
  });

  it('keeps a text within the limit whole, with its spaces tidied', () => {
    expect(excerpt('Mount  corner\nlifted.', 200)).toBe('Mount corner lifted.');
  });

  it('drops trailing punctuation before the ellipsis', () => {
    expect(excerpt('Foxing, slight; cockling, moderate; abrasion', 22)).toBe('Foxing, slight…');
  });

  it('cuts a single word longer than the limit, as nothing shorter stands for it', () => {
    expect(excerpt('x'.repeat(30), 10)).toBe(`${'x'.repeat(10)}…`);
  });
});
