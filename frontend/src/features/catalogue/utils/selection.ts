import { BULK_IDS_MAX, printSelectionQuerySchema, type PrintSelection } from '@toneledger/common/schemas/bulk';
import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';

/**
 * The catalogue list's selection: ticked prints (kept across pages), or "every print matching this
 * search", which is the search itself and is resolved by the server, however many prints it holds.
 */
export type ListSelection =
  | { kind: 'ids'; ids: string[]; /** The row last ticked or unticked by a plain click: where a shift-click range starts. */ anchor: string | null }
  | { kind: 'query'; query: PrintListQuery; total: number };

export const EMPTY_SELECTION: ListSelection = { kind: 'ids', ids: [], anchor: null };

export function isSelected(sel: ListSelection, id: string): boolean {
  return sel.kind === 'query' || sel.ids.includes(id);
}

export function selectedCount(sel: ListSelection): number {
  return sel.kind === 'query' ? sel.total : sel.ids.length;
}

/**
 * A click on a row's box. Without shift it ticks or unticks that row and becomes the anchor. With
 * shift, every row of the page from the anchor to the clicked one takes the clicked row's new state
 * (the anchor must be on this page; otherwise it is a plain click). Ticked ids stop at BULK_IDS_MAX.
 */
export function clickRow(sel: ListSelection, pageIds: readonly string[], id: string, shift: boolean): ListSelection {
  const current = sel.kind === 'ids' ? sel : { kind: 'ids' as const, ids: [...pageIds], anchor: null };
  const on = !current.ids.includes(id);
  const from = current.anchor ? pageIds.indexOf(current.anchor) : -1;
  const to = pageIds.indexOf(id);
  const range = shift && from >= 0 && to >= 0 ? pageIds.slice(Math.min(from, to), Math.max(from, to) + 1) : [id];
  const next = on ? [...current.ids, ...range.filter((r) => !current.ids.includes(r))] : current.ids.filter((r) => !range.includes(r));
  return { kind: 'ids', ids: next.slice(0, BULK_IDS_MAX), anchor: shift && from >= 0 ? current.anchor : id };
}

/** The header box: ticks every row of the page, or unticks them when all are ticked. */
export function togglePage(sel: ListSelection, pageIds: readonly string[]): ListSelection {
  if (sel.kind === 'query') return EMPTY_SELECTION;
  const all = pageIds.every((id) => sel.ids.includes(id));
  const ids = all ? sel.ids.filter((id) => !pageIds.includes(id)) : [...sel.ids, ...pageIds.filter((id) => !sel.ids.includes(id))];
  return { kind: 'ids', ids: ids.slice(0, BULK_IDS_MAX), anchor: sel.anchor };
}

export function selectAllMatching(query: PrintListQuery, total: number): ListSelection {
  return { kind: 'query', query, total };
}

/** What the server is sent: the ids, or the search's filters without page and order. */
export function toPrintSelection(sel: ListSelection): PrintSelection {
  if (sel.kind === 'ids') return { kind: 'ids', ids: sel.ids };
  return { kind: 'query', query: printSelectionQuerySchema.parse(sel.query) };
}

/** The list's filters, without page, page size and order: a changed filter makes an all-matching selection stale. */
export function filtersKey(query: PrintListQuery): string {
  return JSON.stringify(printSelectionQuerySchema.parse(query));
}
