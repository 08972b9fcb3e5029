import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import ICAL from 'ical.js';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

/**
 * A conservator's round of checks: three prints due in one store room are chosen on the work list and
 * planned as a round; on the round's sheet one is checked into a condition report, signed, and shows
 * as checked; the round is then found in the conservator's calendar feed. The prints are made through the API. The risk model schedules new prints in a background
 * job; so that the list need not wait for it, a row is written straight to the table where none is yet,
 * and the test looks at every scheduled print of the room (window "all"), whatever dates the model gives.
 */

const stamp = String(Date.now() % 1_000_000);
const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
const ROOM = `Store room ${stamp}`;
const ROUND = `Checks in ${ROOM}`;

interface Made { id: string; accessionNumber: string }
let prints: Made[] = [];
let roomLabel = '';
let roundUrl = '';
let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  const made = await page.evaluate(
    async ({ s, room }) => {
      const post = async (url: string, body: unknown) => {
        const res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
        if (res.status !== 201) throw new Error(`${url}: ${res.status} ${await res.text()}`);
        return ((await res.json()) as { data: Record<string, unknown> }).data;
      };
      const building = await post('/api/locations', { name: `Harbour building ${s}`, kind: 'building' });
      const store = await post('/api/locations', { name: room, kind: 'room', parentId: building.id });
      const elsewhere = await post('/api/locations', { name: `Annexe ${s}`, kind: 'building' });
      const out = [];
      for (const n of [1, 2, 3, 4]) {
        const print = await post('/api/prints', {
          accessionNumber: `2093.${s}.${n}`, title: `Breakwater in winter ${n}`, process: 'gelatin_silver_developing_out',
          locationId: n === 4 ? elsewhere.id : store.id,
        });
        out.push({ id: print.id as string, accessionNumber: print.accessionNumber as string });
      }
      return { prints: out, roomLabel: store.pathLabel as string };
    },
    { s: stamp, room: ROOM },
  );
  prints = made.prints;
  roomLabel = made.roomLabel;
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    // Overdue, due in 10 days and in 40 days in the store room; the fourth, elsewhere, overdue too.
    const dues = [-5, 10, 40, -3];
    for (const [i, p] of prints.entries()) {
      await client.query(
        `INSERT INTO print_schedules (print_id, computed_due_on, due_on, interval_months, risk, risk_rank, factors, reasons, main_reason)
         VALUES ($1, $2, $2, 24, 'high', 3, $3::jsonb, ARRAY['never_checked'], 'never checked since it was catalogued')
         ON CONFLICT (print_id) DO NOTHING`,
        [p.id, day(dues[i]!), JSON.stringify([{ code: 'never_checked', text: 'never checked since it was catalogued', months: -12, dueBy: null }])],
      );
    }
  } finally {
    await client.end();
  }
  await signInAs(page, 'conservator');
}, 60_000);
afterAll(async () => {
  await browser?.close();
});

describe('a round of checks in one store room', () => {
  it('the conservator opens the work list, chooses the three prints of the room and plans a round', async () => {
    await page.goto(`${BASE_URL}/inspections`);
    await page.getByRole('heading', { level: 1, name: 'Inspections' }).waitFor();
    await page.getByRole('combobox', { name: 'Place' }).selectOption({ label: roomLabel });
    await page.getByRole('button', { name: /Every scheduled print/ }).click();
    await page.waitForURL(/window=all/);
    for (const p of prints.slice(0, 3)) await page.getByRole('checkbox', { name: `Choose ${p.accessionNumber}` }).check();
    expect(await page.getByRole('checkbox', { name: `Choose ${prints[3]!.accessionNumber}` }).count()).toBe(0);
    await page.getByRole('button', { name: 'Plan these checks (3)' }).click();
    const form = page.getByRole('form', { name: 'Plan these checks' });
    expect(await form.getByLabel('Title').inputValue()).toBe(ROUND);
    await form.getByLabel('Day of the round').fill(day(2));
    await screenshot(page, 'inspections-plan');
    await form.getByRole('button', { name: 'Plan the round' }).click();
    await page.getByRole('heading', { level: 1, name: ROUND }).waitFor({ timeout: 20_000 });
    roundUrl = page.url();
    expect(await page.getByTestId('round-progress').textContent()).toBe('0 of 3 checked');
  }, 60_000);

  it('the round lists the prints in shelf order; one is checked into a condition report, signed, and shows as checked', async () => {
    const rows = page.getByRole('table', { name: 'Prints of the round in shelf order' }).getByRole('row');
    await expect.poll(() => rows.count()).toBe(4);
    expect(await rows.nth(1).getByRole('link', { name: prints[0]!.accessionNumber }).count()).toBe(1);
    await screenshot(page, 'inspections-round');
    await rows.nth(1).getByRole('link', { name: 'Check now' }).click();
    await page.waitForURL(new RegExp(`/condition/prints/${prints[0]!.id}/reports/new\\?context=routine`));
    expect(await page.getByLabel('Context').inputValue()).toBe('routine');
    await page.getByRole('radiogroup', { name: 'Overall grade' }).getByRole('radio', { name: /Good/ }).check();
    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.waitForURL(/\/condition\/reports\/[0-9a-f-]{36}$/);
    const reportPath = new URL(page.url()).pathname;
    await page.getByRole('button', { name: 'Sign report' }).click();
    await page.getByRole('button', { name: 'Sign and lock' }).click();
    await page.getByText(/Signed on/).first().waitFor();

    await page.goto(roundUrl);
    await page.getByTestId('round-progress').getByText('1 of 3 checked').waitFor({ timeout: 20_000 });
    const checked = page.getByRole('table', { name: 'Prints of the round in shelf order' }).getByRole('row').nth(1).getByRole('link', { name: /^Checked/ });
    expect(await checked.getAttribute('href')).toBe(reportPath);
    await screenshot(page, 'inspections-round-checked');
  }, 60_000);

  it("the round is in the assignee's calendar feed: made on the Reminders page, read by a general-purpose iCalendar parser", async () => {
    await page.goto(`${BASE_URL}/inspections/reminders`);
    await page.getByRole('heading', { level: 2, name: 'Calendar' }).waitFor();
    const make = page.getByRole('button', { name: /^Make a (new |calendar )address$/ });
    await make.click();
    const url = (await page.getByTestId('feed-url').textContent({ timeout: 20_000 }))!.trim();
    expect(url).toMatch(/\/api\/calendar\/[A-Za-z0-9_-]{40,}\.ics$/);
    await screenshot(page, 'inspections-calendar-address');
    // A calendar program asks without the session: a bare fetch from Node, not the signed-in page.
    const res = await fetch(url);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/calendar/);
    const events = new ICAL.Component(ICAL.parse(await res.text())).getAllSubcomponents('vevent').map((e) => new ICAL.Event(e));
    const mine = events.find((e) => e.summary.includes(ROUND));
    expect(mine, events.map((e) => e.summary).join(' | ')).toBeDefined();
    expect(mine!.startDate.isDate).toBe(true);
    expect(mine!.startDate.toString()).toBe(day(2));
    expect(mine!.uid).toContain(new URL(roundUrl).pathname.split('/').pop()!);
  }, 60_000);
});
