/**
 * In the editor, in Chromium: a new peak/no-load block follows the procedure's mains, a value in the
 * wrong measure is refused at the input with the conversion, and a reading's bare-number tolerance
 * and measure are explained where the author typed them.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser } from '../support/browser';
import { demo } from '../support/test-app';
import { startTestServer } from '../support/test-server';

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let page: Page;

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
  page = await (await browser.newContext()).newPage();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

const block = (title: string) =>
  page.locator('.bw-block', {
    has: page.locator('[data-drag-handle]', {
      hasText: new RegExp(`^${title.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`),
    }),
  });

async function insertBlock(filter: string) {
  await page.keyboard.press('Control+k');
  const menu = page.getByRole('dialog', { name: 'Insert block' });
  await menu.getByRole('combobox').fill(filter);
  await page.keyboard.press('Enter');
  await menu.waitFor({ state: 'detached' });
}

describe('quantities in the editor', () => {
  it('a new peak/no-load block follows the procedure’s mains; a peak typed in an rms field is refused with the conversion', async () => {
    await page.goto(server.url + '/sign-in');
    await page.getByLabel('E-mail').fill(demo.ruth.email);
    await page.getByLabel('Password').fill(demo.ruth.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('link', { name: 'Procedures', exact: true }).first().click();
    await page.getByRole('link', { name: 'New procedure' }).click();
    // The list (with its own title box) stays until the new page has loaded.
    await page.getByRole('heading', { name: 'New procedure' }).waitFor();
    await page.getByLabel('Title').fill('TC-5R HT winding check');
    await page.getByLabel('Equipment family').fill('Table radio');
    await page.getByLabel('Model').fill('TC-5R');
    await page.getByLabel('Tags').fill('power supply');
    await page.getByRole('button', { name: 'Create and start writing' }).click();
    try {
      await page.waitForURL(/\/revisions\/[0-9a-f-]+\/edit$/);
    } catch {
      // Say what the page showed instead, so a failure explains itself.
      const said = await page.getByRole('alert').allTextContents();
      throw new Error(
        `the editor did not open (${page.url()}); the page says: ${said.join(' | ') || 'nothing'}`,
      );
    }
    await page.getByRole('textbox', { name: 'Procedure text' }).click();

    await insertBlock('peak');
    const peak = block('Reckoner · Peak and no-load DC');
    // Both mains fields start as the procedure's parameters, not as typed numbers.
    expect(await peak.getByLabel('Nominal mains: source').inputValue()).toBe('param');
    expect(await peak.getByLabel('Actual mains: source').inputValue()).toBe('param');
    expect(await peak.getByLabel('Actual mains', { exact: true }).inputValue()).toBe('mainsVoltage');

    const winding = peak.getByLabel('Winding voltage (rms)', { exact: true });
    await winding.fill('424 V pk');
    await peak.getByRole('alert').filter({ hasText: 'did you mean 299.8 V rms' }).waitFor();
    await winding.fill('300 mV');
    await peak.getByRole('alert').filter({ hasText: 'no more than the rectifier drop' }).waitFor();
    await winding.fill('250 V');
    await expect
      .poll(() => peak.locator('[data-output="peakVoltage"] [data-value]').textContent())
      .toBe('354 V');
  });

  it('a reading asks for % or a unit in its tolerance, and offers only outputs of its own measure', async () => {
    await page.getByRole('textbox', { name: 'Procedure text' }).press('End');
    await insertBlock('reading');
    const reading = block('Reading');
    await reading.getByLabel('Expected value', { exact: true }).fill('6.3 V');
    await reading.getByLabel('Tolerance (% or a unit)').fill('±5');
    await reading.getByRole('alert').filter({ hasText: 'add % or V' }).waitFor();
    await reading.getByLabel('Tolerance (% or a unit)').fill('±5 %');
    await reading.locator('[data-reading-band]').filter({ hasText: '5.99 V … 6.62 V' }).waitFor();
    // A DC reading lists the block's DC outputs but not its rms winding figure.
    await reading.getByLabel('Expected value: source').selectOption('ref');
    const options = await reading
      .getByLabel('Expected value', { exact: true })
      .locator('option')
      .allTextContents();
    expect(options.some((o) => /No-load DC at the reservoir/.test(o))).toBe(true);
    expect(options.some((o) => /Winding voltage at this mains/.test(o))).toBe(false);
    await reading.getByLabel('Measure', { exact: true }).selectOption('rms');
    await expect
      .poll(async () =>
        (
          await reading.getByLabel('Expected value', { exact: true }).locator('option').allTextContents()
        ).some((o) => /Winding voltage at this mains/.test(o)),
      )
      .toBe(true);
  });
});
