import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser } from '../support/browser';
import { demo } from '../support/test-app';
import { startTestServer } from '../support/test-server';

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

describe('search in Chromium', () => {
  it('"/" focuses the header search, results appear as you type, Enter opens the full results page', async () => {
    const page = await (await browser.newContext()).newPage();
    await page.goto(server.url + '/sign-in');
    await page.getByLabel('E-mail').fill(demo.tom.email);
    await page.getByLabel('Password').fill(demo.tom.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Bench work' }).waitFor();

    await page.keyboard.press('/');
    const box = page.getByRole('combobox', { name: 'Search approved procedures' });
    expect(await box.evaluate((el) => el === document.activeElement)).toBe(true);
    await page.keyboard.type('bleder retrofit');
    const option = page.getByRole('option').filter({ hasText: 'bleeder resistor retrofit' });
    await option.waitFor();
    expect(await option.locator('mark').count()).toBeGreaterThan(0);

    await page.keyboard.press('Enter');
    await page.waitForURL(/\/search\?q=/);
    await page.getByRole('heading', { name: 'Search approved procedures' }).waitFor();
    await page.getByRole('link', { name: /bleeder resistor retrofit/i }).waitFor();

    await page.getByLabel('Search words').fill('zzqqxx');
    await page.getByRole('button', { name: 'Search' }).click();
    await page.getByText('No approved procedure matches.').waitFor();
    await page.context().close();
  });
});
