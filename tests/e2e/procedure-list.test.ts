import { beforeAll, describe, expect, it } from 'vitest';
import { createDb, createPool } from '../../server/db/client';
import { procedureInState, textDoc } from '../support/review-path';
import { useBrowserApp } from '../support/e2e';

const app = useBrowserApp();
const ADDED = 60;
/** The demo library's approved procedures, counted before the test adds its own. */
let demoApproved = 0;

beforeAll(async () => {
  const pool = createPool(app.databaseUrl);
  const db = createDb(pool);
  const counted = await pool.query<{ n: string }>(
    "SELECT count(DISTINCT procedure_id) AS n FROM revisions WHERE state = 'approved'",
  );
  demoApproved = Number(counted.rows[0]!.n);
  for (let i = 0; i < ADDED; i++) {
    const title = `Pager check ${String(i).padStart(2, '0')}`;
    await procedureInState(db, 'approved', {
      title,
      equipmentFamily: 'Organ',
      equipmentModel: `PG-${i}`,
      tags: ['pager'],
      document: textDoc(`${title}: one page of the list.`),
    });
  }
  await pool.end();
});

describe('the procedure list in Chromium', () => {
  it('pages, finds by title and sorts on the server; the address keeps the list as it was left', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'tom');
    await page.goto(app.url + '/procedures');
    const total = ADDED + demoApproved;
    await page.getByText(`Showing 1–50 of ${total}.`).waitFor();
    expect(await page.getByRole('table', { name: 'Procedures' }).locator('tbody tr').count()).toBe(50);

    await page
      .getByRole('navigation', { name: 'Procedure list pages' })
      .getByRole('button', { name: 'Next' })
      .click();
    await page.getByText(`Showing 51–${total} of ${total}.`).waitFor();
    expect(new URL(page.url()).searchParams.get('page')).toBe('2');

    await page.getByLabel('Title contains').fill('PAGER CHECK 1');
    await page.waitForURL((u) => u.searchParams.get('q') === 'PAGER CHECK 1');
    await page.getByText('Showing 1–10 of 10.').waitFor();

    await page.getByRole('button', { name: /^Title/ }).click();
    await page.waitForURL((u) => u.searchParams.get('sort') === 'title');
    const titleHeader = page.getByRole('columnheader', { name: /Title/ });
    await expect.poll(() => titleHeader.getAttribute('aria-sort')).toBe('ascending');
    await expect
      .poll(() =>
        page.getByRole('table', { name: 'Procedures' }).locator('tbody tr td:first-child').allTextContents(),
      )
      .toEqual([...Array(10).keys()].map((i) => `Pager check 1${i}`));

    await page.reload();
    await page.getByText('Showing 1–10 of 10.').waitFor();
    expect(await page.getByLabel('Title contains').inputValue()).toBe('PAGER CHECK 1');
    expect(await titleHeader.getAttribute('aria-sort')).toBe('ascending');

    await page.getByLabel('Title contains').fill('no such title anywhere');
    await page
      .getByText('No procedure title contains “no such title anywhere” with these filters.')
      .waitFor();
    // The empty list says where to go next: the whole list, or a search of the procedures' text.
    expect(await page.getByRole('link', { name: 'Show every procedure' }).getAttribute('href')).toBe(
      '/procedures',
    );
    expect(await page.getByRole('link', { name: 'search the procedures’ text' }).getAttribute('href')).toBe(
      '/search?q=no%20such%20title%20anywhere',
    );

    // From a procedure to the bench: the reader's button opens the start form with it chosen.
    await page.getByLabel('Title contains').fill('pager check 42');
    await page.getByRole('link', { name: 'Pager check 42' }).click();
    await page.getByRole('heading', { name: 'Pager check 42' }).waitFor();
    await page.getByRole('link', { name: 'Start a bench run on this revision' }).click();
    await page.waitForURL((u) => u.pathname === '/runs/new' && u.searchParams.has('revision'));
    const chosen = page.getByLabel('Approved procedure');
    await expect
      .poll(async () => (await chosen.locator('option:checked').textContent()) ?? '')
      .toContain('Pager check 42');
    expect(app.cspViolations).toEqual([]);
    await page.context().close();
  });
});
