import { mkdtempSync, mkdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { DEMO_ACCOUNTS } from '../backend/src/seed/demo-accounts';
import type { Role } from '../common/src/domain/roles';

export const BASE_URL = process.env.E2E_BASE_URL ?? '';
export const SHOTS = path.resolve(import.meta.dirname, '.screenshots');

/** Debian's Chromium driven by playwright-core, each run in a fresh profile. */
export async function openBrowser(): Promise<{ context: BrowserContext; close(): Promise<void> }> {
  if (!BASE_URL) throw new Error('E2E_BASE_URL is not set: run the browser tests with `npm test`.');
  const profile = mkdtempSync(path.join(os.tmpdir(), 'toneledger-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  return {
    context,
    close: async () => {
      try {
        await context.close();
      } finally {
        // Chromium's helper processes may still write to the profile for a moment after close.
        rmSync(profile, { recursive: true, force: true, maxRetries: 10, retryDelay: 200 });
      }
    },
  };
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}

/** Signs in through the app's sign-in page and the identity provider's login form. */
export async function signInAs(page: Page, role: Role): Promise<void> {
  const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
  // Pages of one test file share a browser profile: start each sign-in from no session at all.
  await page.context().clearCookies();
  await page.goto(BASE_URL);
  await page.getByRole('link', { name: 'Sign in' }).or(page.getByRole('button', { name: 'Sign in' })).first().click();
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password').fill(account.password);
  await page.getByRole('button', { name: 'Continue' }).click();
  await page.waitForURL((u) => u.origin === new URL(BASE_URL).origin && !u.pathname.startsWith('/auth/'));
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}
