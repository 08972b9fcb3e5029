import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';
import { ROLES, type Role } from '../common/src/domain/roles';
import { ADMIN_AREAS, areasFor } from '../common/src/domain/areas';

/**
 * axe-core's WCAG 2.1 level A and AA rules (tags wcag2a, wcag2aa, wcag21a, wcag21aa) on every main
 * screen, as each role sees it. A violation fails with the rule, its help text and the elements.
 */
const require = createRequire(import.meta.url);
const AXE_SOURCE = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');
const TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: Array<{ target: string[]; failureSummary?: string }>;
}

let browser: { context: BrowserContext; close(): Promise<void> };
let printId = '';
const stamp = Date.now().toString().slice(-6);

beforeAll(async () => {
  browser = await openBrowser();
  // One print with a process history, made through the API as a registrar, for the print screens.
  const page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  printId = await page.evaluate(async (s) => {
    const post = await fetch('/api/prints', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ accessionNumber: `2097.${s}.1`, title: `Pier lamps in rain ${s}`, process: 'gelatin_silver_developing_out', dateMade: '1971/1977' }),
    });
    if (post.status !== 201) throw new Error(`print: ${post.status} ${await post.text()}`);
    return ((await post.json()) as { data: { id: string } }).data.id;
  }, stamp);
  await page.close();
});
afterAll(() => browser?.close());

async function violationsOn(page: Page): Promise<Violation[]> {
  // Evaluated through the browser's debugging protocol, which the app's Content Security Policy (script-src 'self') does not govern.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(`${AXE_SOURCE}\n;true`);
  return page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: { run(ctx: Document, opts: object): Promise<{ violations: Violation[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  }, TAGS);
}

function describeViolations(where: string, violations: Violation[]): string {
  return violations
    .map((v) => `${where}: ${v.id} (${v.impact}) ${v.help}\n${v.nodes.slice(0, 5).map((n) => `    ${n.target.join(' ')} ${n.failureSummary?.split('\n')[1] ?? ''}`).join('\n')}`)
    .join('\n');
}

/** The main screens a role opens: home, every area it may enter, a print's pages, and the admin screens. */
function screensFor(role: Role): string[] {
  const areas = areasFor(role).map((a) => a.path);
  const admin = role === 'admin' ? areasFor(role, ADMIN_AREAS).map((a) => a.path) : [];
  const print = [`/catalogue/prints/${printId}`, '/catalogue/recipes'];
  const condition = areas.includes('/condition') ? [`/condition/prints/${printId}`] : [];
  return ['/', ...areas, ...print, ...condition, ...admin];
}

describe('accessibility: axe-core WCAG 2.1 A and AA on every main screen, per role', () => {
  it.each(ROLES)('%s', async (role) => {
    const page = await browser.context.newPage();
    const found: string[] = [];
    try {
      await page.setViewportSize({ width: 1440, height: 900 });
      await signInAs(page, role);
      for (const path of screensFor(role)) {
        await page.goto(new URL(path, BASE_URL).toString());
        const opened = await page.getByRole('heading', { level: 1 }).first().waitFor({ timeout: 45_000 }).then(() => true, () => false);
        if (!opened) {
          found.push(`${role} ${path}: the screen showed no level-1 heading within 45 s`);
          await screenshot(page, `axe-${role}-${path.replace(/[^a-z0-9]+/gi, '-')}-no-heading`);
          continue;
        }
        // Let lists and panels finish loading before the check.
        await page.waitForLoadState('networkidle');
        await page.waitForFunction(() => document.querySelectorAll('[aria-busy="true"], [role="progressbar"]').length === 0, undefined, { timeout: 20_000 }).catch(() => {});
        const violations = await violationsOn(page);
        if (violations.length) {
          found.push(describeViolations(`${role} ${path}`, violations));
          await screenshot(page, `axe-${role}-${path.replace(/[^a-z0-9]+/gi, '-')}`);
        }
      }
    } finally {
      await page.close();
    }
    expect(found.join('\n'), found.join('\n')).toBe('');
  }, 420_000);
});
