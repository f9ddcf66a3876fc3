// In Chromium: an approved revision printed as a blank bench sheet for a chosen mains (the download is
// a PDF), then a bench run whose readings are copied from that paper: the run sheet shows the paper's
// date. Every screen used fits 390, 1024 and 1366 px wide.
import { readFile } from 'node:fs/promises';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';

const app = useBrowserApp();
const TITLE = 'TC-18 combo: first power-up of the HT supply';

async function fitsAt(page: Page, width: number) {
  await page.setViewportSize({ width, height: 900 });
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(overflow, `${page.url()} wider than ${width} px`).toBeLessThanOrEqual(0);
}
const fitsEverywhere = async (page: Page) => {
  for (const width of [390, 1024, 1366]) await fitsAt(page, width);
};

describe('blank bench sheet and a run copied from it, in Chromium', () => {
  it('prints the sheet for 236 V, starts a run from the paper with its date, and the run sheet shows that date', async () => {
    const page = await app.openPage();
    await page.setViewportSize({ width: 1024, height: 1100 });
    await app.signIn(page, 'tom');
    const list = await page.request.get(`${app.url}/api/procedures?q=${encodeURIComponent(TITLE)}`);
    const procedure = (
      (await list.json()) as { procedures: { title: string; approved: { id: string } | null }[] }
    ).procedures.find((p) => p.title === TITLE)!;
    const revisionId = procedure.approved!.id;

    // 1. The reader: "Print a blank bench sheet", for a chosen mains.
    await page.goto(`${app.url}/revisions/${revisionId}`);
    await page.getByRole('heading', { level: 1, name: TITLE }).waitFor();
    await page.getByText('Print a blank bench sheet').click();
    await fitsEverywhere(page);
    const mains = page.getByLabel('Mains for the sheet (V rms)');
    await mains.fill('400');
    await page.getByRole('button', { name: 'Print the bench sheet (PDF)' }).click();
    await page.getByRole('alert').filter({ hasText: 'must be at most' }).waitFor();
    await mains.fill('236');
    await page.getByLabel('Mains frequency (Hz)').fill('50');
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Print the bench sheet (PDF)' }).click(),
    ]);
    const name = download.suggestedFilename();
    expect(name).toMatch(/^bench-sheet-BS-[0-9a-f]{12}-236V-50Hz-\d{8}\.pdf$/);
    const bytes = await readFile((await download.path())!);
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
    const sheetId = name.replace(/^bench-sheet-/, '').replace(/\.pdf$/, '');

    // 2. Later, the paper's readings go into a run: started from the revision, at the sheet's mains.
    await page.setViewportSize({ width: 1024, height: 1100 });
    await page.getByRole('link', { name: 'Start a bench run on this revision' }).click();
    const unit = page.getByLabel('Unit on the bench');
    await unit.locator('option', { hasText: 'TC-18' }).first().waitFor({ state: 'attached' });
    const unitValue = await unit.locator('option', { hasText: 'TC-18' }).first().getAttribute('value');
    await unit.selectOption(unitValue!);
    await page.getByLabel('Measured mains (V)').fill('236');
    await page.getByLabel('Mains frequency (Hz)').fill('50');
    await page.getByLabel('The readings are copied from a paper bench sheet').check();
    const date = page.getByLabel('Paper sheet date');
    // A date after today is refused beside its field.
    const tomorrow = new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 10);
    await date.fill(tomorrow);
    await page.getByLabel('Sheet identifier (optional)').fill(sheetId);
    await fitsEverywhere(page);
    await page.getByRole('button', { name: 'Start the bench run' }).click();
    await page.getByRole('alert').filter({ hasText: 'is in the future' }).waitFor();
    const today = await page.evaluate(() => {
      const d = new Date();
      return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
    });
    await date.fill(today);
    await page.getByRole('button', { name: 'Start the bench run' }).click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    const runId = page.url().split('/').pop()!;
    const panel = page.locator('[data-paper-sheet]');
    await panel.getByText(`Entries are being copied from a paper sheet dated ${today}`).waitFor();

    // 3. Copy the steps up to the first reading from the paper: hazard notes read, checks ticked, the reading in its band.
    const steps = await page.$$eval('[data-step-id]', (els) =>
      els.map((e) => ({
        id: (e as HTMLElement).dataset.stepId!,
        kind: (e as HTMLElement).dataset.stepKind!,
      })),
    );
    const reading = steps.find((s) => s.kind === 'reading')!;
    for (const step of steps.slice(0, steps.indexOf(reading))) {
      const before = page.locator(`[data-step-id="${step.id}"]`);
      if (step.kind === 'hazard') {
        await before.getByRole('button', { name: 'I have read this hazard note' }).click();
        await before.getByRole('button', { name: '✓ Hazard note acknowledged' }).waitFor();
      } else {
        await before.getByRole('button', { name: 'Mark as done' }).click();
        await before.getByRole('button', { name: /Done/ }).waitFor();
      }
    }
    const card = page.locator(`[data-step-id="${reading.id}"]`);
    const band = await card.locator('[data-band]').getAttribute('data-band');
    const [low, high] = (band || '0:2').split(':').map(Number) as [number, number];
    await card.getByRole('textbox', { name: /^Measured:/ }).fill(`${((low + high) / 2).toPrecision(5)}`);
    await card.getByRole('button', { name: 'Record reading' }).click();
    await card.locator('[data-saved]').getByText(`from a paper sheet dated ${today}`).waitFor();
    await page.locator('[data-pending-count]').waitFor({ state: 'detached' });
    await fitsEverywhere(page);

    // 4. The run sheet says where the entries came from, and when each was taken.
    await page.setViewportSize({ width: 1024, height: 1100 });
    await page.getByRole('link', { name: 'Run sheet' }).click();
    await page.waitForURL(new RegExp(`/runs/${runId}/sheet$`));
    await page.getByText(`Entered from a paper sheet dated ${today} (sheet ${sheetId})`).waitFor();
    await page
      .locator(`[data-reading-row="${reading.id}"]`)
      .getByText(`entered from a paper sheet dated ${today}`)
      .waitFor();
    await fitsEverywhere(page);
    const pdf = await page.request.get(`${app.url}/api/runs/${runId}/sheet.pdf`);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
  });
});
