import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { demo } from '../support/test-app';

const app = useBrowserApp();
const { openPage } = app;

/** Signs in from the start page, which must send an anonymous visitor to the sign-in form. */
async function signIn(page: Page, email: string, password: string) {
  await page.goto(app.url + '/');
  await page.waitForURL(/\/sign-in/);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

const homeByRole = [
  { who: 'tom', panel: 'My bench runs in progress' },
  { who: 'hal', panel: 'My drafts and returned revisions' },
  { who: 'marek', panel: 'Revisions waiting for my review' },
  { who: 'admin', panel: 'Instruments due for calibration' },
] as const;

describe('signing in as each demo role in Chromium', () => {
  for (const { who, panel } of homeByRole) {
    it(`${who} (${demo[who].roles.join(', ')}) sees their home page, then signs out`, async () => {
      const page = await openPage();
      await signIn(page, demo[who].email, demo[who].password);
      await page.getByRole('heading', { name: panel }).waitFor();
      // Only admins get the People link.
      expect(await page.getByRole('link', { name: 'People', exact: true }).count()).toBe(
        who === 'admin' ? 1 : 0,
      );
      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.waitForURL(/\/sign-in/);
      await page.context().close();
    });
  }

  it('a wrong password shows a readable message and stays on the sign-in page', async () => {
    const page = await openPage();
    await signIn(page, demo.tom.email, 'definitely-wrong');
    await page.getByRole('alert').filter({ hasText: 'do not match' }).waitFor();
    expect(page.url()).toMatch(/\/sign-in/);
    await page.context().close();
  });

  it('an admin invites a person and is told the link went by mail (it is never shown); an unknown page shows the 404 page', async () => {
    const page = await openPage();
    await signIn(page, demo.admin.email, demo.admin.password);
    await page.getByRole('link', { name: 'People', exact: true }).first().click();
    await page.getByRole('heading', { name: 'People' }).waitFor();
    await page.getByLabel('Name').fill('Ada Fenwick');
    // Checked in the page with the server's rules, beside the field: nothing is sent.
    await page.getByLabel('E-mail').fill('ada at tallowcreek');
    await page.getByRole('button', { name: 'Create invitation' }).click();
    await page.getByRole('alert').filter({ hasText: 'not a valid e-mail address' }).waitFor();
    // A refusal the server alone can make lands beside the field it is about.
    await page.getByLabel('E-mail').fill(demo.tom.email);
    await page.getByRole('button', { name: 'Create invitation' }).click();
    await page
      .getByRole('alert')
      .filter({ hasText: `${demo.tom.email} already has an account.` })
      .waitFor();
    await page.getByLabel('E-mail').fill('ada@tallowcreek.example');
    await page.getByRole('button', { name: 'Create invitation' }).click();
    await page.getByText('went to ada@tallowcreek.example').waitFor();
    expect(await page.getByText('/set-password/').count()).toBe(0);
    await page.getByRole('cell', { name: 'ada@tallowcreek.example' }).waitFor();
    await page.goto(app.url + '/no/such/page');
    await page.getByRole('heading', { name: 'Nothing here' }).waitFor();
    await page.context().close();
  });

  it('a write still goes through after the same person signed out and in again in another tab (the token moved on)', async () => {
    const first = await openPage();
    await signIn(first, demo.priya.email, demo.priya.password);
    await first.getByRole('link', { name: 'Units', exact: true }).click();
    await first.getByRole('heading', { name: 'Units' }).waitFor();
    // A second tab of the same browser signs out and in again: a new session id and a new CSRF token.
    const second = await first.context().newPage();
    await second.goto(app.url + '/');
    await second.getByRole('button', { name: 'Sign out' }).click();
    await second.waitForURL(/\/sign-in/);
    await second.getByLabel('E-mail').fill(demo.priya.email);
    await second.getByLabel('Password').fill(demo.priya.password);
    await second.getByRole('button', { name: 'Sign in' }).click();
    await second.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    // The first tab still holds the old token; its write is refused once, then sent again with the new one.
    const form = first.getByRole('form', { name: 'Register a unit' });
    await form.getByLabel('Model').fill('TC-30H');
    await form.getByLabel('Serial').fill('TAB-0001');
    await form.getByRole('button', { name: 'Register unit' }).click();
    await first.getByRole('link', { name: 'TAB-0001' }).waitFor();
    await first.context().close();
  });
});
