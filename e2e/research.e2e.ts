import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import yauzl from 'yauzl';
import type { BrowserContext, Page } from 'playwright-core';
import { logRank, type SurvivalObs } from '../common/src/domain/survival';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

/**
 * A researcher compares iron-blue-toned prints on fibre paper with and without an alkaline after-bath.
 * The least the question needs is made through the API in a store room of its own: ten prints, each with a
 * process history (development, iron blue toning, an after-bath alkaline or not) and two signed condition
 * reports, the first graded good on 1 January 2010, the second good (censored) or fair (the event). The
 * schedule's job brings the prints' outcomes up to date, oldest marks first; on a database just seeded
 * with the demo its queue is long, so the test dates these ten prints' marks first in the queue (SQL),
 * waits for the job to take them after each round of reports, and then through the API until all ten
 * count for survival.
 */

const stamp = String(Date.now() % 1_000_000);
const ROOM = `Research store ${stamp}`;
const START = '2010-01-01';
// [second report on, graded fair (the event)?]
const YES: [string, boolean][] = [['2016-01-01', true], ['2017-01-01', false], ['2018-01-01', true], ['2019-01-01', false], ['2020-01-01', true]];
const NO: [string, boolean][] = [['2012-01-01', true], ['2013-01-01', true], ['2014-01-01', false], ['2015-01-01', true], ['2016-01-01', true]];
// Years as the server counts them: days / 365.25.
const years = (on: string) => (Date.parse(on) - Date.parse(START)) / 86_400_000 / 365.25;
const obs = (rows: [string, boolean][]): SurvivalObs[] => rows.map(([on, event]) => ({ time: years(on), event }));

let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
let printIds: string[] = [];
let roomLabel = '';

async function api<T>(p: Page, method: string, url: string, body?: unknown): Promise<T> {
  return p.evaluate(
    async ({ method, url, body }) => {
      const res = await fetch(url, { method, headers: { 'content-type': 'application/json' }, body: body === undefined ? undefined : JSON.stringify(body) });
      if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${await res.text()}`);
      return ((await res.json()) as { data: unknown }).data;
    },
    { method, url, body },
  ) as Promise<T>;
}

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  const store = await api<{ id: string; pathLabel: string }>(page, 'POST', '/api/locations', { name: ROOM, kind: 'room' });
  roomLabel = store.pathLabel;
  const made: { id: string; alkaline: boolean; second: [string, boolean] }[] = [];
  for (const [alkaline, rows] of [[true, YES], [false, NO]] as const) {
    for (const [i, second] of rows.entries()) {
      const print = await api<{ id: string; version: number }>(page, 'POST', '/api/prints', {
        accessionNumber: `2094.${stamp}.${alkaline ? i + 1 : i + 6}`, title: `Harbour crane in blue ${i + 1}`, process: 'gelatin_silver_developing_out',
        support: 'fibre_baryta', locationId: store.id,
      });
      await api(page, 'PUT', `/api/prints/${print.id}/steps`, {
        version: print.version,
        steps: [{ type: 'development' }, { type: 'toning', tonerClass: 'iron_blue' }, { type: 'after_bath', alkaline }],
      });
      made.push({ id: print.id, alkaline, second });
    }
  }
  printIds = made.map((m) => m.id);
  await signInAs(page, 'conservator');
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    // The first reports, then (once the job has taken their marks) the second ones: a print's second
    // signature while the job is still working on its first mark can leave its outcome a report behind.
    for (const round of [0, 1] as const) {
      for (const m of made) {
        const [on, fair] = round === 0 ? [START, false] : m.second;
        const draft = await api<{ id: string; version: number }>(page, 'POST', `/api/prints/${m.id}/condition-reports`, { examinedOn: on, context: 'routine', grade: fair ? 'fair' : 'good', observations: [] });
        await api(page, 'POST', `/api/condition-reports/${draft.id}/sign`, { version: draft.version });
      }
      await client.query("UPDATE schedule_stale SET since = '2000-01-01' WHERE print_id = ANY ($1::uuid[])", [printIds]);
      for (let tries = 0; ; tries++) {
        const { rows } = await client.query<{ n: number }>('SELECT count(*)::int AS n FROM schedule_stale WHERE print_id = ANY ($1::uuid[])', [printIds]);
        if (rows[0]!.n === 0) break;
        if (tries > 180) throw new Error(`The schedule job left ${rows[0]!.n} of these prints marked for 180 s.`);
        await page.waitForTimeout(1000);
      }
    }
  } finally {
    await client.end();
  }
  await signInAs(page, 'researcher');
  // The outcomes are brought up to date by the schedule's job: wait until all ten count for survival.
  const query = { filters: [{ factor: 'location', locationId: store.id }], event: { kind: 'grade', grade: 'fair' } };
  for (let tries = 0; ; tries++) {
    const r = await api<{ groups: { withSurvival: number }[] }>(page, 'POST', '/api/research/cohort', query);
    if (r.groups.reduce((n, g) => n + g.withSurvival, 0) === 10) break;
    if (tries > 180) {
      const c = new pg.Client({ connectionString: process.env.DATABASE_URL });
      await c.connect();
      const marks = await c.query('SELECT count(*)::int AS all, count(*) FILTER (WHERE print_id = ANY ($1::uuid[]))::int AS ours FROM schedule_stale', [printIds]);
      await c.end();
      throw new Error(`The prints’ outcomes were not brought up to date within 180 s (${JSON.stringify(r.groups)}; marks waiting: ${JSON.stringify(marks.rows[0])}).`);
    }
    await page.waitForTimeout(1000);
  }
}, 300_000);
afterAll(() => browser?.close());

function zipNames(buf: Buffer): Promise<string[]> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(buf, { lazyEntries: true }, (err, zip) => {
      if (err || !zip) return reject(err);
      const names: string[] = [];
      zip.on('entry', (e: yauzl.Entry) => { names.push(e.fileName); zip.readEntry(); });
      zip.on('end', () => resolve(names));
      zip.readEntry();
    });
  });
}

describe('a researcher compares iron blue on fibre with and without an alkaline after-bath', () => {
  it('builds the query, sees the curves, the log-rank test and the hazard ratio, opens the prints behind a figure and exports the package', async () => {
    await page.goto(`${BASE_URL}/research`);
    const form = page.getByRole('form', { name: 'Cohort query' });
    await form.waitFor();
    await form.locator('details[data-factor="support"] summary').click();
    await form.getByRole('group', { name: 'Support' }).getByLabel('Fibre-based (baryta)').check();
    await form.locator('details[data-factor="tonerClass"] summary').click();
    await form.getByRole('group', { name: 'Toner', exact: true }).getByLabel('Iron blue (Prussian blue)').check();
    await form.locator('details[data-factor="location"] summary').click();
    await form.getByLabel('Storage place (and everything inside it)').selectOption({ label: roomLabel });
    await form.getByLabel('Group by').selectOption('alkalineAfterBath');
    await form.getByLabel('The event').selectOption('grade');
    await form.getByLabel('Graded at or below').selectOption('fair');
    await form.getByRole('group', { name: 'Cox model factors (up to five)' }).getByLabel('Alkaline after-bath').check();
    await form.getByRole('button', { name: 'Run query' }).click();

    // The query is in the URL: the link alone reproduces it.
    await page.waitForURL(/\/research\?q=/);
    const q = JSON.parse(new URL(page.url()).searchParams.get('q')!);
    expect(q.groupBy).toEqual(['alkalineAfterBath']);
    expect(q.event).toEqual({ kind: 'grade', grade: 'fair' });

    const groups = page.getByRole('table', { name: 'Groups' });
    await groups.waitFor();
    expect(await groups.locator('tbody tr').count()).toBe(2);

    // Two step curves with their bands.
    const chart = page.getByRole('img', { name: /Kaplan–Meier curves/ });
    await chart.waitFor();
    expect(await chart.locator('.recharts-line').count()).toBe(2);
    expect(await chart.locator('.recharts-area').count()).toBe(2);
    // Medians worked by hand from the times above: without the bath, S falls to 0.3 at 5 years; with it, to 0 at 10 years.
    const curves = page.getByRole('table', { name: 'Curves per group' });
    expect(await curves.getByRole('row', { name: /: no/ }).locator('td').last().textContent()).toMatch(/^5\.0 /);
    expect(await curves.getByRole('row', { name: /: yes/ }).locator('td').last().textContent()).toMatch(/^10\.0 /);

    // The log-rank test as the statistics module gives it on the raw times.
    const expected = logRank([obs(YES), obs(NO)]);
    expect(await page.getByTestId('logrank-figures').textContent()).toBe(`χ² = ${expected.chi2.toFixed(2)}, df = 1, ${expected.p < 0.001 ? 'p < 0.001' : `p = ${expected.p.toFixed(3)}`}`);
    const hr = page.getByRole('table', { name: 'Hazard ratios' });
    const hrRow = hr.locator('tbody tr').first();
    expect(await hrRow.locator('th').textContent()).toBe('Alkaline after-bath: Yes (against No)');
    // Fewer events later with the bath: a hazard ratio below 1 against "no".
    const ratio = Number(await hrRow.locator('td').first().textContent());
    expect(ratio).toBeGreaterThan(0);
    expect(ratio).toBeLessThan(1);
    await screenshot(page, 'research-answer');

    // The events of the group without the bath: four prints, each a link to its record.
    await curves.getByRole('row', { name: /: no/ }).locator('td').nth(1).getByRole('button').click();
    const panel = page.getByRole('dialog', { name: 'Prints behind the figure' });
    await panel.getByText('4 prints.').waitFor();
    const links = panel.getByRole('link');
    expect(await links.count()).toBe(4);
    const href = (await links.first().getAttribute('href'))!;
    expect(printIds).toContain(href.split('/').pop());
    await links.first().click();
    await page.waitForURL(new RegExp(`${href}$`));
    await page.goBack();
    await page.getByRole('table', { name: 'Groups' }).waitFor();

    // The data package: a zip holding datapackage.json.
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export the data package' }).click()]);
    const file = await download.path();
    const names = await zipNames(readFileSync(file));
    expect(names).toContain('datapackage.json');
  });
});
