import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { demo } from '../support/test-app';

const app = useBrowserApp();

/** The smallest valid PNG (one pixel), so the server's content sniffing accepts it as an image. */
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==',
  'base64',
);

describe('a page that cannot load its data, and an upload after the token moved on', () => {
  it('a revision that does not exist shows a readable message inside the app, with a way back', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'hal');
    await page.goto(`${app.url}/revisions/${randomUUID()}`);
    const problem = page.getByRole('alert');
    await problem.getByRole('heading', { name: 'Not found' }).waitFor();
    // The server's own words, and the reassurance; the app's navigation is still there.
    expect(await problem.textContent()).toContain('No such revision.');
    expect(await problem.textContent()).toContain('Nothing you saved is lost.');
    expect(await page.getByRole('navigation', { name: 'Main' }).count()).toBe(1);
    // The way back leads to the list of procedures.
    await problem.getByRole('link', { name: 'All procedures' }).click();
    await page.getByRole('heading', { name: 'Procedures', exact: true }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/procedures');
    // The error page and the list's loader build nothing that makes zod probe for eval under the CSP.
    expect(app.cspViolations).toEqual([]);
    await page.context().close();
  });

  it('an address that names no revision says which part is wrong', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'hal');
    await page.goto(`${app.url}/revisions/not-an-id/edit`);
    const problem = page.getByRole('alert');
    await problem.getByRole('heading', { name: 'That address does not name anything' }).waitFor();
    expect(await problem.textContent()).toContain('The revision address is not valid');
    expect(await problem.textContent()).not.toContain('params.id');
    await page.context().close();
  });

  it('a panel that cannot load (the sign-offs) says so in its own region; the rest of the revision stays, and a retry brings it back', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'tom');
    const revisionId = await page.evaluate(async () => {
      const list = await (await fetch('/api/procedures')).json();
      return list.procedures.find(
        (p: { equipmentModel: string; approved: unknown }) => p.equipmentModel === 'TC-18' && p.approved,
      ).approved.id as string;
    });
    const signatures = '**/api/revisions/*/signatures';
    await page.route(signatures, (route) =>
      route.fulfill({
        status: 503,
        contentType: 'application/json',
        body: JSON.stringify({ error: 'Sign-offs are being checked; try again in a minute.' }),
      }),
    );
    await page.goto(`${app.url}/revisions/${revisionId}`);
    const region = page.getByRole('region', { name: 'Sign-offs' });
    await region.getByRole('heading', { name: 'Sign-offs ran into a problem' }).waitFor();
    expect(await region.textContent()).toContain('Sign-offs are being checked; try again in a minute.');
    // The rest of the page is still there: the procedure's title and the way to start a bench run.
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toMatch(/\S/);
    expect(await page.getByRole('link', { name: 'Start a bench run on this revision' }).count()).toBe(1);
    await page.unroute(signatures);
    await region.getByRole('button', { name: 'Try again' }).click();
    await page
      .getByText(/Approved by /)
      .first()
      .waitFor();
    expect(await page.getByRole('heading', { name: 'Sign-offs ran into a problem' }).count()).toBe(0);
    await page.context().close();
  });

  it('a unit photo sent with a stale token (signed out and in again in another tab) is sent again and kept', async () => {
    const first = await app.openPage();
    await app.signIn(first, 'priya');
    await first.getByRole('link', { name: 'Units', exact: true }).click();
    await first.getByRole('link', { name: 'TC18-0142' }).click();
    await first.getByRole('heading', { name: 'Photos' }).waitFor();
    const before = await first.getByRole('img', { name: 'Stale-token photo' }).count();
    // A second tab of the same browser signs out and in again: a new session and a new CSRF token.
    const second = await first.context().newPage();
    await second.goto(app.url + '/');
    await second.getByRole('button', { name: 'Sign out' }).click();
    await second.waitForURL(/\/sign-in/);
    await second.getByLabel('E-mail').fill(demo.priya.email);
    await second.getByLabel('Password').fill(demo.priya.password);
    await second.getByRole('button', { name: 'Sign in' }).click();
    await second.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    // The first tab still holds the old token: the upload is refused once, then sent with the new one.
    const answers: number[] = [];
    first.on('response', (r) => {
      if (r.request().method() === 'POST' && r.url().endsWith('/photos')) answers.push(r.status());
    });
    await first.getByLabel('Caption').fill('Stale-token photo');
    await first
      .getByLabel('Add photo')
      .setInputFiles({ name: 'chassis.png', mimeType: 'image/png', buffer: PNG });
    await first.getByRole('img', { name: 'Stale-token photo' }).nth(before).waitFor();
    expect(answers).toEqual([403, 201]);
    await first.context().close();
  });
});
