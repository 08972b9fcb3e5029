import { describe, expect, it } from 'vitest';
import { changedKeys, changesOnly, fieldList, rebase, staleRows } from '@/lib/forms/stale-edit';

type Values = { title: string; status: string; notes: string; rows: { key: string; amount: string }[] };

const fields = fieldList({ title: 'Title', status: 'Status', notes: 'Notes', rows: 'Rows' });
// Row keys only keep a list steady on screen; they are not part of what is compared.
const comparable = (v: Values) => ({ ...v, rows: v.rows.map((r) => r.amount) });
const describe_ = (key: string, v: Values) => (key === 'rows' ? v.rows.map((r) => r.amount) : v[key as 'title' | 'status' | 'notes']);

const opened: Values = { title: 'Pier', status: 'in_store', notes: '', rows: [{ key: 'a', amount: '1' }] };
const saved: Values = { title: 'Pier at dusk', status: 'on_display', notes: '', rows: [{ key: 'b', amount: '1' }] };
const mine: Values = { title: 'Pier, winter', status: 'in_store', notes: 'Faded corner', rows: [{ key: 'c', amount: '1' }] };

describe('stale-edit review', () => {
  it('lists every field changed on either side, in form order, with before, saved and typed values', () => {
    expect(staleRows({ fields, opened, saved, mine, comparable, describe: describe_ })).toEqual([
      { key: 'title', label: 'Title', opened: 'Pier', saved: 'Pier at dusk', yours: 'Pier, winter', theyChanged: true, youChanged: true },
      { key: 'status', label: 'Status', opened: 'in_store', saved: 'on_display', yours: 'in_store', theyChanged: true, youChanged: false },
      { key: 'notes', label: 'Notes', opened: '', saved: '', yours: 'Faded corner', theyChanged: false, youChanged: true },
    ]);
  });

  it('re-applies the person’s edits on the saved version: theirs kept where the person changed nothing', () => {
    expect(rebase(fields, opened, saved, mine, comparable)).toEqual({ title: 'Pier, winter', status: 'on_display', notes: 'Faded corner', rows: [{ key: 'b', amount: '1' }] });
  });

  it('sends only the changed fields, an empty one as null, with the version', () => {
    expect(changedKeys(fields, opened, mine, comparable)).toEqual(['title', 'notes']);
    expect(changesOnly({ title: 'Pier, winter', notes: undefined, status: 'in_store' }, ['title', 'notes'], 4)).toEqual({ version: 4, title: 'Pier, winter', notes: null });
  });
});
