// In Chromium: the home page lists what waits for the signed-in person, each a link that works, and
// fits 390, 1024 and 1366 px wide.
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';

const app = useBrowserApp();

const section = (page: Page, key: string) => page.locator(`[data-home-section="${key}"]`);

async function fitsAt(page: Page, width: number) {
  await page.setViewportSize({ width, height: 900 });
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(overflow, `page wider than ${width} px`).toBeLessThanOrEqual(0);
}

describe('home page in Chromium', () => {
  it('a technician sees their run in progress first and the revision to read; both links open their pages', async () => {
    const page = await app.openPage();
    await page.setViewportSize({ width: 390, height: 900 });
    await app.signIn(page, 'priya');
    await page.getByRole('heading', { name: /My bench runs in progress/ }).waitFor();
    // Her own runs come first, before the other sections.
    expect(await page.locator('[data-home-section]').first().getAttribute('data-home-section')).toBe('runs');
    expect(await section(page, 'reviews').count()).toBe(0);
    const runs = section(page, 'runs');
    expect(await runs.getByRole('heading').innerText()).toMatch(/1\s*waiting/);
    for (const width of [390, 1024, 1366]) await fitsAt(page, width);

    await runs.getByRole('link', { name: /TC30H-0088/ }).click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { level: 1 }).waitFor();
    // The demo approved revision 2 of the bleeder retrofit after this run started on revision 1.
    const warning = page.locator('[data-superseded]');
    await warning.waitFor();
    expect(await warning.innerText()).toContain('Revision 2 replaced revision 1');
    await warning.getByRole('link', { name: 'Open revision 2' }).waitFor();

    await page.goBack();
    const acks = section(page, 'acknowledgements');
    await acks.getByRole('heading').waitFor();
    await acks.getByRole('listitem').getByRole('link').first().click();
    await page.waitForURL(/\/revisions\/[0-9a-f-]{36}\/acknowledge$/);
    await page.getByRole('heading', { level: 1 }).waitFor();
    await page.context().close();
  });

  it('a reviewer sees the review sections and the instruments falling due; the section links open their lists', async () => {
    const page = await app.openPage();
    await page.setViewportSize({ width: 1366, height: 900 });
    await app.signIn(page, 'marek');
    await page.getByRole('heading', { name: /Revisions waiting for my review/ }).waitFor();
    await page.getByRole('heading', { name: /Procedures due for periodic review/ }).waitFor();
    expect(await section(page, 'runs').count()).toBe(0);
    // The demo always has an instrument past its calibration date.
    await section(page, 'instruments').getByRole('link', { name: 'TC-IR-01' }).waitFor();
    for (const width of [390, 1024, 1366]) await fitsAt(page, width);

    await section(page, 'reviews').getByRole('link', { name: 'Review queue' }).click();
    await page.waitForURL(/\/review$/);
    await page.getByRole('heading', { level: 1 }).waitFor();
    await page.goBack();
    await section(page, 'instruments').getByRole('link', { name: 'Instrument register' }).click();
    await page.waitForURL(/\/instruments$/);
    await page.getByRole('heading', { level: 1 }).waitFor();
    await page.context().close();
  });
});
