import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { useBrowserApp } from '../support/e2e';

const app = useBrowserApp();
let page: Page;

beforeAll(async () => {
  page = await app.openPage();
  await app.signIn(page, 'hal');
});
afterAll(() => page.context().close());

describe('inserting a block from the editor toolbar', () => {
  it('puts the caret in the new hazard note and check step, so typed text lands in them; empty ones are flagged', async () => {
    await page.goto(`${app.url}/procedures/new`);
    await page.getByRole('heading', { name: 'New procedure' }).waitFor();
    await page.getByLabel('Title').fill('TC-5R cold checks');
    await page.getByLabel('Equipment family').fill('Table radio');
    await page.getByLabel('Model').fill('TC-5R');
    await page.getByRole('button', { name: 'Create and start writing' }).click();
    await page.waitForURL(/\/revisions\/[0-9a-f-]+\/edit$/);
    const text = page.getByRole('textbox', { name: 'Procedure text' });
    await text.waitFor();
    const toolbar = page.getByRole('toolbar', { name: 'Procedure text' });
    const empty = page.locator('[data-procedure-check] [data-check-code="block-empty"]');

    await text.click();
    await toolbar.getByRole('button', { name: 'Hazard note', exact: true }).click();
    const note = page.locator('.hazard-note').last();
    await note.waitFor();
    await expect.poll(() => empty.count()).toBe(1);
    await page.keyboard.type('Mains on the chassis terminals.');
    await expect
      .poll(() => note.locator('.hazard-note-text').textContent())
      .toBe('Mains on the chassis terminals.');
    await expect.poll(() => empty.count()).toBe(0);

    await toolbar.getByRole('button', { name: 'Check step', exact: true }).click();
    const step = page.getByLabel('The technician confirms').last();
    await expect.poll(() => empty.count()).toBe(1);
    await expect.poll(() => step.evaluate((e) => e === document.activeElement)).toBe(true);
    await page.keyboard.type('Mains plug pulled.');
    expect(await step.inputValue()).toBe('Mains plug pulled.');
    await expect.poll(() => empty.count()).toBe(0);
    // Nothing typed leaked into a paragraph of its own.
    expect(await text.locator(':scope > p').allTextContents()).not.toContain('Mains plug pulled.');
  });
});
