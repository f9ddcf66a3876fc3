import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser } from '../support/browser';
import { demo } from '../support/test-app';
import { startTestServer } from '../support/test-server';

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let page: Page;
const cspViolations: string[] = [];
const loadedScripts: string[] = [];

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
  page = await (await browser.newContext()).newPage();
  page.on('console', (m) => {
    if (/Content.Security.Policy/i.test(m.text())) cspViolations.push(m.text().slice(0, 200));
  });
  page.on('request', (r) => {
    if (r.resourceType() === 'script') loadedScripts.push(new URL(r.url()).pathname);
  });
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

/** A structured block by its exact heading ("Reading", "Reckoner · Mains fuse"). */
const block = (title: string) =>
  page.locator('.bw-block', {
    has: page.locator('[data-drag-handle]', {
      hasText: new RegExp(`^${title.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`),
    }),
  });
const output = (scope: ReturnType<typeof block>, key: string) =>
  scope.locator(`[data-output="${key}"] dd[data-figure] [data-value]`);

async function insertBlock(filter: string) {
  await page.keyboard.press('Control+k');
  const menu = page.getByRole('dialog', { name: 'Insert block' });
  await menu.getByRole('combobox').fill(filter);
  await page.keyboard.press('Enter');
  await menu.waitFor({ state: 'detached' });
}

describe('an author writes a procedure with live reckoners in Chromium', () => {
  let editUrl = '';
  let fuseBefore = '';

  it('creates a procedure and lands in its editor', async () => {
    await page.goto(server.url + '/sign-in');
    await page.getByLabel('E-mail').fill(demo.hal.email);
    await page.getByLabel('Password').fill(demo.hal.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('link', { name: 'Procedures', exact: true }).first().click();
    await page.getByRole('link', { name: 'New procedure' }).click();
    // The list (with its own title box) stays until the new page has loaded.
    await page.getByRole('heading', { name: 'New procedure' }).waitFor();
    await page.getByLabel('Title').fill('TC-18 first power-up after recap');
    await page.getByLabel('Equipment family').fill('Guitar combo');
    await page.getByLabel('Model').fill('TC-18');
    await page.getByLabel('Tags').fill('power supply, first power-up');
    await page.getByRole('button', { name: 'Create and start writing' }).click();
    await page.waitForURL(/\/revisions\/[0-9a-f-]+\/edit$/);
    editUrl = page.url();
    await page.getByRole('textbox', { name: 'Procedure text' }).waitFor();
  });

  it('inserts a mains-fuse reckoner from the keyboard and its fuse follows a winding current', async () => {
    await page.getByRole('textbox', { name: 'Procedure text' }).click();
    await insertBlock('mains fuse');
    const fuse = block('Reckoner · Mains fuse');
    await fuse.getByLabel('Winding voltage, row 1', { exact: true }).fill('250');
    await fuse.getByLabel('Winding current (AC rms), row 1', { exact: true }).fill('100m');
    const rating = output(fuse, 'fuseDesignation');
    await expect.poll(() => rating.textContent()).toBe('T 160 mA');
    fuseBefore = (await rating.textContent())!;
    await fuse.getByLabel('Winding current (AC rms), row 1', { exact: true }).fill('500m');
    await expect.poll(() => rating.textContent()).toBe('T 800 mA');
    expect(fuseBefore).not.toBe('T 800 mA');
    // An unreadable input says why, at the input, instead of going blank.
    await fuse.getByLabel('Winding voltage, row 1', { exact: true }).fill('lots');
    await fuse.getByRole('alert').filter({ hasText: 'is not a number ("lots")' }).waitFor();
    expect(await rating.count()).toBe(0);
    await fuse.getByLabel('Winding voltage, row 1', { exact: true }).fill('250');
    await expect.poll(() => rating.textContent()).toBe('T 800 mA');
  });

  it('adds a loaded-B+ reckoner and a reading bound to its output, with the band shown', async () => {
    await insertBlock('loaded');
    const bplus = block('Reckoner · Loaded B+');
    await bplus.getByLabel('Block name').fill('bplus');
    await bplus.getByLabel('Winding voltage (rms, unloaded)', { exact: true }).fill('250');
    await bplus.getByLabel('Source resistance', { exact: true }).fill('100');
    await bplus.getByLabel('Reservoir capacitance', { exact: true }).fill('47u');
    await bplus.getByLabel('Load current (DC)', { exact: true }).fill('60m');
    await expect.poll(() => output(bplus, 'averageDc').textContent()).toBe('319 V');

    await insertBlock('reading');
    const reading = block('Reading');
    await reading.getByLabel('What to measure').fill('B+ at the reservoir');
    await reading.getByLabel('Where (test point)').fill('C5 positive to chassis');
    await reading.getByLabel('Meter range').fill('1000 V DC');
    await reading.getByLabel('Expected value: source').selectOption('ref');
    await reading.getByLabel('Expected value', { exact: true }).selectOption('bplus.averageDc');
    await reading.getByLabel('Tolerance').fill('±10 %');
    await expect
      .poll(() => reading.locator('[data-reading-band]').textContent())
      .toMatch(/Expected band: 287 V … 351 V/);
  });

  it('saves with Ctrl+S, reloads and finds everything as it was left', async () => {
    await page.keyboard.press('Control+s');
    await page.locator('[data-save-state="saved"]').waitFor();
    expect(
      await page
        .getByRole('status')
        .filter({ hasText: /^Saved \d/ })
        .count(),
    ).toBe(1);

    await page.goto(editUrl);
    await page.getByRole('textbox', { name: 'Procedure text' }).waitFor();
    expect(await page.getByText('This device kept unsaved work').count()).toBe(0);
    const fuse = block('Reckoner · Mains fuse');
    expect(await fuse.getByLabel('Winding current (AC rms), row 1', { exact: true }).inputValue()).toBe(
      '500m',
    );
    await expect.poll(() => output(fuse, 'fuseDesignation').textContent()).toBe('T 800 mA');
    const bplus = block('Reckoner · Loaded B+');
    expect(await bplus.getByLabel('Block name').inputValue()).toBe('bplus');
    expect(await bplus.getByLabel('Reservoir capacitance', { exact: true }).inputValue()).toBe('47u');
    const reading = block('Reading');
    expect(await reading.getByLabel('Expected value', { exact: true }).inputValue()).toBe('bplus.averageDc');
    expect(await reading.getByLabel('Tolerance').inputValue()).toBe('±10 %');
    await expect.poll(() => reading.locator('[data-reading-band]').textContent()).toMatch(/287 V … 351 V/);
    await page.locator('[data-save-state="saved"]').waitFor();
  });

  it('the procedure check links a warning to its block', async () => {
    // 319 V with no hazard note in the section: the check names the loaded-B+ block.
    // Named by its label, never by the internal name "bplus".
    const warning = page
      .locator('[data-procedure-check] button')
      .filter({ hasText: 'the Loaded B+ (capacitor input) block' })
      .first();
    await warning.click();
    const focused = await page.evaluate(
      () => document.activeElement?.closest('[data-block-id]')?.textContent ?? '',
    );
    expect(focused).toContain('Loaded B+');
  });

  it('check steps and hazard notes carry their structure, and the procedure check follows it', async () => {
    const check = (code: string) => page.locator(`[data-procedure-check] [data-check-code="${code}"]`);
    const toEnd = async () => {
      await page.getByRole('textbox', { name: 'Procedure text' }).focus();
      await page.keyboard.press('Control+End');
    };
    // The reading in volts is live work with nothing after it to verify the discharge.
    await expect.poll(() => check('discharge-check-missing').count()).toBe(1);
    await toEnd();
    await insertBlock('discharge verified');
    const verified = block('Check step').last();
    expect(await verified.getByLabel('Kind of step').inputValue()).toBe('discharge-verified');
    await expect.poll(() => check('discharge-check-missing').count()).toBe(0);
    // A threshold that is not a voltage is named at the input; one above the safe voltage by the check.
    await verified.getByLabel('Verified below').fill('sixty');
    await verified.getByRole('alert').filter({ hasText: '"sixty" is not a voltage' }).waitFor();
    await verified.getByLabel('Verified below').fill('100 V');
    await expect.poll(() => check('discharge-threshold-high').count()).toBe(1);
    await verified.getByLabel('Verified below').fill('60 V');
    await expect.poll(() => check('discharge-threshold-high').count()).toBe(0);

    // A note flagged one hand and isolation covers a live step after it; its words alone would not.
    await toEnd();
    await insertBlock('hazard note');
    const note = page.locator('.hazard-note').last();
    // The cursor lands in the new note's text: no click needed to write it.
    await page.keyboard.type('Live from here: one hand, isolation transformer.');
    expect(await note.locator('.hazard-note-text').textContent()).toBe(
      'Live from here: one hand, isolation transformer.',
    );
    await note.getByLabel('Work one hand only').check();
    await note.getByLabel('Isolation transformer').check();
    await toEnd();
    await insertBlock('check step');
    const live = block('Check step').last();
    // The caret goes to the new step's text.
    await expect
      .poll(() => live.getByLabel('The technician confirms').evaluate((e) => e === document.activeElement))
      .toBe(true);
    await page.keyboard.type('Series lamp dims within 30 s.');
    expect(await live.getByLabel('The technician confirms').inputValue()).toBe(
      'Series lamp dims within 30 s.',
    );
    await live.getByLabel('Live work (unit powered)').check();
    // Now a live step follows the only discharge verification; the reading before the note stays unguarded.
    await expect.poll(() => check('discharge-check-missing').count()).toBe(1);
    await expect.poll(() => check('live-step-unguarded').count()).toBe(1);
    await note.getByLabel('Isolation transformer').uncheck();
    await expect.poll(() => check('live-step-unguarded').count()).toBe(2);
    await note.getByLabel('Isolation transformer').check();
    await expect.poll(() => check('live-step-unguarded').count()).toBe(1);

    await page.keyboard.press('Control+s');
    await page.locator('[data-save-state="saved"]').waitFor();
    await page.reload();
    await page.getByRole('textbox', { name: 'Procedure text' }).waitFor();
    expect(await block('Check step').first().getByLabel('Verified below').inputValue()).toBe('60 V');
    expect(await block('Check step').last().getByLabel('Live work (unit powered)').isChecked()).toBe(true);
    expect(await page.locator('.hazard-note').last().getByLabel('Work one hand only').isChecked()).toBe(true);
    expect(
      await page.locator('.hazard-note').last().getByLabel('Current-limited', { exact: false }).isChecked(),
    ).toBe(false);
  });

  it('the reader shows the stored results without downloading the editor', async () => {
    const revisionUrl = editUrl.replace(/\/edit$/, '');
    const reader = await (await browser.newContext()).newPage();
    const scripts: string[] = [];
    reader.on('request', (r) => {
      if (r.resourceType() === 'script') scripts.push(new URL(r.url()).pathname);
    });
    reader.on('console', (m) => {
      if (/Content.Security.Policy/i.test(m.text())) cspViolations.push(m.text().slice(0, 200));
    });
    await reader.goto(server.url + '/sign-in');
    await reader.getByLabel('E-mail').fill(demo.hal.email);
    await reader.getByLabel('Password').fill(demo.hal.password);
    await reader.getByRole('button', { name: 'Sign in' }).click();
    await reader.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await reader.goto(revisionUrl);
    await reader.getByRole('heading', { name: 'TC-18 first power-up after recap' }).waitFor();
    await reader
      .locator('[data-reckoner="mainsFuse"] [data-output="fuseDesignation"] dd')
      .filter({ hasText: 'T 800 mA' })
      .waitFor();
    await reader.getByRole('cell', { name: '287 V … 351 V' }).waitFor();
    expect(scripts.some((s) => /edit-revision/.test(s))).toBe(false);
    expect(loadedScripts.some((s) => /edit-revision/.test(s))).toBe(true);
    await reader.context().close();
  });

  it('keeps unsaved work on the device across a reload and offers to restore it', async () => {
    await page.goto(editUrl);
    const tolerance = block('Reading').getByLabel('Tolerance');
    await tolerance.fill('±5 %');
    page.once('dialog', (d) => void d.accept());
    await page.reload(); // before the autosave delay has passed
    await page.getByText('This device kept unsaved work').waitFor();
    expect(await block('Reading').getByLabel('Tolerance').inputValue()).toBe('±10 %');
    await page.getByRole('button', { name: 'Restore it' }).click();
    expect(await block('Reading').getByLabel('Tolerance').inputValue()).toBe('±5 %');
    await expect
      .poll(() => block('Reading').locator('[data-reading-band]').textContent())
      .toMatch(/303 V … 335 V/);
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 10_000 });
  });

  it('a save that lost the race shows both versions and keeps the author’s on request', async () => {
    const other = await (await browser.newContext()).newPage();
    await other.goto(server.url + '/sign-in');
    await other.getByLabel('E-mail').fill(demo.hal.email);
    await other.getByLabel('Password').fill(demo.hal.password);
    await other.getByRole('button', { name: 'Sign in' }).click();
    await other.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await other.goto(editUrl);
    await other.getByLabel('Title').fill('TC-18 first power-up (bench copy)');
    await other.keyboard.press('Control+s');
    await other.locator('[data-save-state="saved"]').waitFor();
    await other.context().close();

    await page.getByLabel('Title').fill('TC-18 first power-up after recap, checked');
    const conflict = page.getByRole('alertdialog', { name: 'Two versions of this draft' });
    await conflict.waitFor({ timeout: 10_000 });
    // The differing field by its label, with both values in words: yours, then the saved one.
    const title = conflict.locator('tr[data-field="Title"]');
    expect(await title.locator('td').allTextContents()).toEqual([
      'TC-18 first power-up after recap, checked',
      'TC-18 first power-up (bench copy)',
    ]);
    expect(await conflict.textContent()).not.toMatch(/[{}"]|attrs|inputs/);
    expect(await page.locator('[data-save-state]').getAttribute('data-save-state')).toBe('conflict');
    await conflict.getByRole('button', { name: 'Keep mine and save it' }).click();
    await page.locator('[data-save-state="saved"]').waitFor();
    expect(await conflict.count()).toBe(0);
    await page.reload();
    expect(await page.getByLabel('Title').inputValue()).toBe('TC-18 first power-up after recap, checked');
  });

  it('runs under the strict Content-Security-Policy with no violations', () => {
    expect(cspViolations).toEqual([]);
  });
});
