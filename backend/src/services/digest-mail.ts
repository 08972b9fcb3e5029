/** The weekly digest's message: overdue and due-soon prints grouped by place, as text and HTML. */

export interface DigestItem {
  printId: string;
  accessionNumber: string;
  title: string | null;
  dueOn: string;
  locationLabel: string | null;
}

export interface DigestMessage { subject: string; text: string; html: string; overdue: number; due: number }

/** Days ahead the digest looks: overdue prints and those due within this many days. */
export const DIGEST_DAYS_AHEAD = 30;
const NO_PLACE = 'No location recorded';

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** Items grouped by their place, places in label order, the unplaced last; each group by due date. */
export function groupByPlace(items: DigestItem[]): { place: string; items: DigestItem[] }[] {
  const groups = new Map<string, DigestItem[]>();
  for (const item of items) {
    const key = item.locationLabel ?? NO_PLACE;
    groups.set(key, [...(groups.get(key) ?? []), item]);
  }
  return [...groups.entries()]
    .sort(([a], [b]) => (a === NO_PLACE ? 1 : b === NO_PLACE ? -1 : a.localeCompare(b)))
    .map(([place, list]) => ({ place, items: list.sort((x, y) => x.dueOn.localeCompare(y.dueOn) || x.accessionNumber.localeCompare(y.accessionNumber)) }));
}

export function digestMessage(input: { name: string; week: string; today: string; items: DigestItem[]; publicUrl: string }): DigestMessage {
  const link = (path: string) => new URL(path, input.publicUrl).toString();
  const overdue = input.items.filter((i) => i.dueOn < input.today).length;
  const due = input.items.length - overdue;
  const state = (i: DigestItem) => (i.dueOn < input.today ? `overdue since ${i.dueOn}` : `due ${i.dueOn}`);
  const groups = groupByPlace(input.items);
  const worklist = link('/inspections');
  const head = `${overdue} ${overdue === 1 ? 'print is' : 'prints are'} overdue for inspection and ${due} ${due === 1 ? 'is' : 'are'} due in the next ${DIGEST_DAYS_AHEAD} days.`;

  const text = [
    `Hello ${input.name},`, '', head, '',
    ...groups.flatMap((g) => [
      g.place,
      ...g.items.map((i) => `  ${i.accessionNumber}${i.title ? ` ${i.title}` : ''}: ${state(i)}\n    ${link(`/catalogue/prints/${i.printId}`)}`),
      '',
    ]),
    `The work list: ${worklist}`,
    `Change or stop this weekly message: ${link('/inspections/reminders')}`,
  ].join('\n');

  const html = [
    `<p>Hello ${escapeHtml(input.name)},</p>`, `<p>${escapeHtml(head)}</p>`,
    ...groups.map((g) => [
      `<h3>${escapeHtml(g.place)}</h3>`, '<ul>',
      ...g.items.map((i) => `<li><a href="${escapeHtml(link(`/catalogue/prints/${i.printId}`))}">${escapeHtml(i.accessionNumber)}</a>${i.title ? ` ${escapeHtml(i.title)}` : ''}: ${escapeHtml(state(i))}</li>`),
      '</ul>',
    ].join('\n')),
    `<p><a href="${escapeHtml(worklist)}">Open the work list</a></p>`,
    `<p><small><a href="${escapeHtml(link('/inspections/reminders'))}">Change or stop this weekly message</a></small></p>`,
  ].join('\n');

  return { subject: `Inspections for week ${input.week}: ${overdue} overdue, ${due} due soon`, text, html, overdue, due };
}
