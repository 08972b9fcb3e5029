import { describe, expect, it } from 'vitest';
import { show } from '@/features/catalogue/components/history-list';

describe('history values', () => {
  it('shows references by name and step lists one line per step', () => {
    expect(show({ id: 'x', name: 'Buffered folder', alkalineBuffered: true })).toBe('Buffered folder');
    expect(show({ id: 'y', pathLabel: 'Annex › Box 3' })).toBe('Annex › Box 3');
    expect(show([{ type: 'toning', tonerClass: 'iron_blue', recipe: { id: 'r', name: 'Iron blue bath' }, timeSeconds: 240 }, { type: 'final_wash', timeSeconds: 1800 }])).toBe(
      '1. toning, iron blue, Iron blue bath, 240 s\n2. final wash, 1800 s',
    );
    expect(show([])).toBe('none');
    expect(show(null)).toBe('—');
  });
});
