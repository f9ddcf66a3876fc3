// The API reference page: an admin reads every operation of /api/openapi.json, with who may call it and
// its inputs; anyone else is told the page is for admins.
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';

const app = useBrowserApp();

describe('the API reference page', () => {
  it('lists each operation with its access, parameters and body fields for an admin', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'admin');
    await page.getByRole('link', { name: 'API', exact: true }).click();
    await page.getByRole('heading', { name: 'API reference' }).waitFor();

    const register = page
      .getByRole('article')
      .filter({ has: page.getByRole('heading', { name: 'post /api/units', exact: true }) });
    await register.getByText('Who may call it: technician, author, reviewer, admin').waitFor();
    expect(
      await register
        .getByRole('listitem')
        .filter({ hasText: /^model — string, 1–80 characters$/ })
        .count(),
    ).toBe(1);
    expect(
      await register
        .getByRole('listitem')
        .filter({ hasText: /^owner \(optional\)/ })
        .count(),
    ).toBe(1);

    const unit = page
      .getByRole('article')
      .filter({ has: page.getByRole('heading', { name: 'get /api/units/{id}', exact: true }) });
    await unit.getByText('id (path) — string, uuid').waitFor();
    await page.context().close();
  });

  it('tells a technician the page is for admins', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'tom');
    await page.goto(app.url + '/admin/api');
    await page.getByText('This page is for admins.').waitFor();
    expect(await page.getByRole('article').count()).toBe(0);
    await page.context().close();
  });

  it('the pages ran under the strict Content-Security-Policy with no violations', () => {
    expect(app.cspViolations).toEqual([]);
  });
});
