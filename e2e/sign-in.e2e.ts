import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';
import { ROLES, ROLE_LABELS } from '../common/src/domain/roles';
import { AREAS, ADMIN_AREAS, areasFor } from '../common/src/domain/areas';
import { DEMO_ACCOUNTS } from '../backend/src/seed/demo-accounts';

let browser: { context: BrowserContext; close(): Promise<void> };
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(() => browser?.close());

describe('sign in and out as each role', () => {
  it.each(ROLES)('%s sees their own navigation and signs out', async (role) => {
    const page = await browser.context.newPage();
    try {
      await signInAs(page, role);
      const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
      await expect.poll(() => page.getByText(account.name).first().isVisible()).toBe(true);
      await expect.poll(() => page.getByText(ROLE_LABELS[role], { exact: true }).first().isVisible()).toBe(true);

      const nav = page.getByRole('navigation', { name: 'Main' });
      const shown = await nav.getByRole('link').allInnerTexts();
      const text = shown.map((s) => s.trim());
      for (const area of AREAS) {
        const allowed = areasFor(role).includes(area);
        expect(text.includes(area.label), `${role} / ${area.label}`).toBe(allowed);
      }
      for (const area of ADMIN_AREAS) {
        expect(await page.getByRole('link', { name: area.label }).count(), `${role} / ${area.label}`).toBe(role === 'admin' ? 1 : 0);
      }
      await screenshot(page, `home-${role}`);

      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.waitForURL((u) => u.pathname === '/signed-out');
      await page.getByText('You have signed out').waitFor();
      const me = await page.evaluate(async () => (await fetch('/api/me')).status);
      expect(me).toBe(401);
      await screenshot(page, `signed-out-${role}`);
    } finally {
      await page.close();
    }
  });

  it('signing out ends the provider session too: the next sign-in asks for the password again', async () => {
    const page = await browser.context.newPage();
    try {
      await signInAs(page, 'researcher');
      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.waitForURL((u) => u.pathname === '/signed-out');
      await page.goto(`${BASE_URL}/auth/login`);
      await page.getByLabel('Password').waitFor();
      expect(new URL(page.url()).pathname).toMatch(/^\/interaction\//);
    } finally {
      await page.close();
    }
  });

  it('a wrong password stays on the provider page with a message', async () => {
    const page = await browser.context.newPage();
    try {
      await page.goto(`${BASE_URL}/auth/login`);
      await page.getByLabel('E-mail').fill('registrar@calder-reach.example');
      await page.getByLabel('Password').fill('not-the-password');
      await page.getByRole('button', { name: 'Continue' }).click();
      await page.getByRole('alert').waitFor();
      expect(await page.getByRole('alert').innerText()).toMatch(/do not match/);
    } finally {
      await page.close();
    }
  });
});

describe('roles are enforced on the server', () => {
  it("a viewer's call to an admin API gets 403 in the error envelope", async () => {
    const page = await browser.context.newPage();
    try {
      await signInAs(page, 'viewer');
      const result = await page.evaluate(async () => {
        const list = await fetch('/api/users');
        const change = await fetch('/api/users/00000000-0000-4000-8000-000000000000/role', {
          method: 'PATCH',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ role: 'admin' }),
        });
        return { list: list.status, listBody: (await list.json()) as { error: { code: string } }, change: change.status };
      });
      expect(result.list).toBe(403);
      expect(result.listBody.error.code).toBe('forbidden');
      expect(result.change).toBe(403);
      await page.goto(`${BASE_URL}/admin/users`);
      await page.getByText(/not allowed/i).first().waitFor();
      await screenshot(page, 'viewer-admin-page');
    } finally {
      await page.close();
    }
  });

  it('an unknown page shows the not-found page', async () => {
    const page = await browser.context.newPage();
    try {
      await signInAs(page, 'registrar');
      await page.goto(`${BASE_URL}/no/such/page`);
      await page.getByRole('heading', { name: 'Page not found' }).waitFor();
    } finally {
      await page.close();
    }
  });
});
