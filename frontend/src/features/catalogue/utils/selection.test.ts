import { describe, expect, it } from 'vitest';
import { BULK_IDS_MAX } from '@toneledger/common/schemas/bulk';
import { printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import { clickRow, EMPTY_SELECTION, selectAllMatching, toPrintSelection, togglePage } from '@/features/catalogue/utils/selection';
import { bareLabel, lastLevels, shortTitle } from '@/features/catalogue/utils/compact';

const page = ['a', 'b', 'c', 'd', 'e', 'f'];

describe('list selection', () => {
  it('a plain click ticks one row; shift-click ticks the range from the last plain click, either way round', () => {
    let s = clickRow(EMPTY_SELECTION, page, 'b', false);
    expect(s).toEqual({ kind: 'ids', ids: ['b'], anchor: 'b' });
    s = clickRow(s, page, 'e', true);
    expect(s.kind === 'ids' && [...s.ids].sort()).toEqual(['b', 'c', 'd', 'e']);
    // Upwards from the same anchor adds a, keeps the rest.
    s = clickRow(s, page, 'a', true);
    expect(s.kind === 'ids' && [...s.ids].sort()).toEqual(['a', 'b', 'c', 'd', 'e']);
  });

  it('shift-click on a ticked row unticks the whole range', () => {
    let s = clickRow(EMPTY_SELECTION, page, 'a', false);
    s = clickRow(s, page, 'f', true);
    expect(s.kind === 'ids' && s.ids).toHaveLength(6);
    s = clickRow(s, page, 'c', false); // untick c, c becomes the anchor
    s = clickRow(s, page, 'e', true); // e is ticked: the range c..e is unticked
    expect(s.kind === 'ids' && [...s.ids].sort()).toEqual(['a', 'b', 'f']);
  });

  it('a shift-click whose anchor is on another page ticks only the row', () => {
    const s = clickRow({ kind: 'ids', ids: ['x'], anchor: 'x' }, page, 'c', true);
    expect(s.kind === 'ids' && [...s.ids].sort()).toEqual(['c', 'x']);
  });

  it('the header box ticks the page, keeping rows of other pages, and unticks it', () => {
    let s = togglePage({ kind: 'ids', ids: ['x'], anchor: null }, page);
    expect(s.kind === 'ids' && s.ids).toHaveLength(7);
    s = togglePage(s, page);
    expect(s.kind === 'ids' && s.ids).toEqual(['x']);
  });

  it('never holds more ticked ids than the server takes', () => {
    const many = Array.from({ length: BULK_IDS_MAX + 5 }, (_, i) => `p${i}`);
    const s = togglePage(EMPTY_SELECTION, many);
    expect(s.kind === 'ids' && s.ids).toHaveLength(BULK_IDS_MAX);
  });

  it('"all matching" sends the search filters without page, size or order, never ids', () => {
    const query = printListQuerySchema.parse({ q: 'harbour', tonerClass: 'iron_blue', page: '4', pageSize: '100', sort: '-title' });
    const sel = selectAllMatching(query, 48_210);
    expect(toPrintSelection(sel)).toEqual({ kind: 'query', query: { q: 'harbour', tonerClass: 'iron_blue', holding: 'collection' } });
    // Unticking a row of an all-matching selection falls back to the page's rows less that one.
    const s = clickRow(sel, page, 'c', false);
    expect(s.kind === 'ids' && [...s.ids].sort()).toEqual(['a', 'b', 'd', 'e', 'f']);
  });
});

describe('compact words', () => {
  it('shows a location as its last two levels', () => {
    expect(lastLevels('Calder Reach › Store B › Cabinet 3 › Drawer 4')).toBe('Cabinet 3 › Drawer 4');
    expect(lastLevels('Store B')).toBe('Store B');
  });
  it('shortens a long title at a word, with an ellipsis', () => {
    const t = 'Harbour wall at low tide, with the ferry slipway and the breakwater beyond';
    const s = shortTitle(t);
    expect(s.length).toBeLessThanOrEqual(34);
    expect(s.endsWith('…')).toBe(true);
    expect(t.startsWith(s.slice(0, -1))).toBe(true);
    expect(shortTitle('Short title')).toBe('Short title');
    expect(bareLabel('Iron blue (Prussian blue)')).toBe('Iron blue');
  });
});
