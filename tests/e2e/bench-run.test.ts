import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { demo } from '../support/test-app';

const app = useBrowserApp();
const { cspViolations } = app;

async function signIn(page: Page, email: string, password: string) {
  await page.goto(app.url + '/');
  await page.waitForURL(/\/sign-in/);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { name: 'My bench runs in progress' }).waitFor();
}

const progressText = (page: Page) => page.locator('[data-progress]').innerText();

describe('a bench run in Chromium', () => {
  it('registers a unit, runs the TC-18 procedure with a hazard note, an out-of-tolerance reading and an offline entry, signs, and exports the PDF', async () => {
    const context = await app.browser.newContext({ viewport: { width: 1024, height: 1366 } });
    const page = await context.newPage();
    page.on('console', (m) => {
      if (/Content.Security.Policy/i.test(m.text())) cspViolations.push(m.text().slice(0, 160));
    });
    await signIn(page, demo.tom.email, demo.tom.password);

    // 1. Register the unit.
    await page.getByRole('link', { name: 'Units', exact: true }).click();
    await page.getByRole('heading', { name: 'Units' }).waitFor();
    const form = page.getByRole('form', { name: 'Register a unit' });
    await form.getByLabel('Model').fill('TC-18');
    await form.getByLabel('Serial').fill('TC18-0457');
    await form.getByLabel('Owner').fill('Wren Halloway');
    await form.getByLabel('Job number').fill('J-2207');
    await form.getByRole('button', { name: 'Register unit' }).click();
    await page.getByText('Registered TC-18 serial TC18-0457.').waitFor();
    await page.getByRole('link', { name: 'TC18-0457' }).click();
    await page.getByRole('heading', { name: /TC-18 · TC18-0457/ }).waitFor();
    const unitUrl = page.url();

    // 2. Start a run on the approved TC-18 procedure at the mains measured at the bench.
    await page.getByRole('link', { name: 'Start a bench run on this unit' }).click();
    const procedureSelect = page.getByLabel('Approved procedure', { exact: true });
    await procedureSelect
      .locator('option', { hasText: 'TC-18 combo: first power-up' })
      .waitFor({ state: 'attached' });
    const value = await procedureSelect
      .locator('option', { hasText: 'TC-18 combo: first power-up' })
      .getAttribute('value');
    // Started too soon, the form says beside each field what is missing or out of range.
    await page.getByLabel('Measured mains (V)').fill('500 V');
    await page.getByRole('button', { name: 'Start the bench run' }).click();
    await page.getByRole('alert').filter({ hasText: 'choose a procedure' }).waitFor();
    await page.getByRole('alert').filter({ hasText: 'must be at most' }).waitFor();
    await procedureSelect.selectOption(value!);
    await page.getByLabel('Measured mains (V)').fill('236 V');
    await page.getByLabel('Mains frequency (Hz)').fill('50');
    await page.getByRole('button', { name: 'Start the bench run' }).click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    const runId = page.url().split('/').pop()!;
    await page.locator('[data-progress]').waitFor();
    const steps = await page.$$eval('[data-step-id]', (els) =>
      els.map((e) => ({
        id: (e as HTMLElement).dataset.stepId!,
        kind: (e as HTMLElement).dataset.stepKind!,
      })),
    );
    const total = steps.length;
    expect(total).toBeGreaterThan(10);
    expect(await progressText(page)).toBe(`0 of ${total} steps`);

    // The first step is a hazard note; what follows stays locked until it is acknowledged.
    expect(steps[0]!.kind).toBe('hazard');
    const second = page.locator(`[data-step-id="${steps[1]!.id}"]`);
    await second.getByText('Acknowledge the hazard note above before this step.').waitFor();

    let outReading = '';
    const outNote = 'Reservoir capacitor bulging; replaced after this run.';
    const last = steps[steps.length - 1]!;
    for (const step of steps.slice(0, -1)) {
      const card = page.locator(`[data-step-id="${step.id}"]`);
      if (step.kind === 'hazard') {
        await card.getByRole('button', { name: 'I have read this hazard note' }).click();
        await card.getByRole('button', { name: '✓ Hazard note acknowledged' }).waitFor();
      } else if (step.kind === 'check') {
        await card.getByRole('button', { name: 'Mark as done' }).click();
        await card.getByRole('button', { name: /Done/ }).waitFor();
      } else {
        const band = await card.locator('[data-band]').getAttribute('data-band');
        const [low, high] = (band || '0:2').split(':').map(Number) as [number, number];
        const input = card.getByRole('textbox', { name: /^Measured:/ });
        if (!outReading && band) {
          // One reading well above its band: the mark shows before it is sent.
          outReading = step.id;
          await card.getByRole('button', { name: 'Record reading' }).click();
          await card.getByText('type the reading first').waitFor();
          await input.fill(`${(high * 1.3).toPrecision(4)}`);
          await card.locator('[data-mark="out"]').first().waitFor();
          await card.getByRole('textbox', { name: 'Note (optional)' }).fill(outNote);
        } else {
          await input.fill(`${((low + high) / 2).toPrecision(5)}`);
        }
        await card.getByRole('button', { name: 'Record reading' }).click();
        await card.locator('[data-saved]').waitFor();
      }
    }
    expect(outReading).not.toBe('');
    await page.locator('[data-pending-count]').waitFor({ state: 'detached' });

    // 3. The server goes out of reach: the last entry is kept on the tablet and shown as pending.
    await context.setOffline(true);
    const lastCard = page.locator(`[data-step-id="${last.id}"]`);
    if (last.kind === 'reading') {
      await lastCard.getByRole('textbox', { name: /^Measured:/ }).fill('1');
      await lastCard.getByRole('button', { name: 'Record reading' }).click();
    } else {
      await lastCard
        .getByRole('button', {
          name: last.kind === 'hazard' ? 'I have read this hazard note' : 'Mark as done',
        })
        .click();
    }
    await lastCard.locator('[data-pending="true"]').waitFor();
    await page.locator('[data-pending-count="1"]').waitFor();
    expect(await progressText(page)).toBe(`${total} of ${total} steps`);
    // Nothing to sign while an entry waits for the server: the panel says so instead of a dead button.
    await page
      .locator('[data-sign-waiting]')
      .filter({ hasText: '1 queued entry reaches the server' })
      .waitFor();
    expect(await page.getByRole('button', { name: 'Sign as performed' }).count()).toBe(0);

    // Back online: the entry is sent, and nothing is pending any more.
    await context.setOffline(false);
    await lastCard.locator('[data-saved]').waitFor({ timeout: 15_000 });
    await page.locator('[data-pending-count]').waitFor({ state: 'detached' });

    // 4. A reload loses nothing.
    await page.reload();
    await page.locator('[data-progress]').waitFor();
    expect(await progressText(page)).toBe(`${total} of ${total} steps`);
    await page.locator(`[data-step-id="${outReading}"] [data-mark="out"]`).waitFor();
    expect(await page.locator('[data-saved]').count()).toBe(total);

    // 5. Sign with the password again; the run sheet shows the table and the out mark.
    await page.getByLabel('Your password').fill(demo.tom.password);
    await page.getByRole('button', { name: 'Sign as performed' }).click();
    await page.waitForURL(new RegExp(`/runs/${runId}/sheet$`));
    await page.getByRole('heading', { name: /^Run sheet: TC-18 combo/ }).waitFor();
    await page.locator('[data-run-out]').waitFor();
    await page.locator(`[data-reading-row="${outReading}"] [data-mark="out"]`).waitFor();
    // The technician's note on the out-of-band reading is on the sheet, in its row (as in the PDF).
    await page.locator(`[data-reading-row="${outReading}"] [data-reading-note]`).getByText(outNote).waitFor();
    expect(await page.locator('[data-reading-row]').count()).toBe(
      steps.filter((s) => s.kind === 'reading').length,
    );
    await page.getByText('The stored run content matches the signed hash.').waitFor();
    await page.getByText('Lethal voltages.').first().waitFor();
    // The readings against their bands: an image with a name and a description, the out-of-band
    // reading a triangle, the axis titled with its unit, the figures in a table beside it
    // (WCAG 2.1 SC 1.1.1 and 1.4.1, docs/references.md §11).
    const plot = page.getByRole('img', { name: 'Readings against their bands', exact: true });
    await plot.waitFor();
    const described = await plot.evaluate(
      (svg) => document.getElementById(svg.getAttribute('aria-describedby') ?? '')?.textContent ?? '',
    );
    expect(described).toMatch(/readings plotted as the deviation from the expected value in percent/);
    expect(described).toMatch(/Out of band: \d+\. /);
    expect(await plot.locator(`[data-plot-point="${outReading}"] [data-marker="out"]`).count()).toBe(1);
    expect(await plot.locator('text', { hasText: 'Deviation from expected (%)' }).count()).toBe(1);
    // The readings figure's own table (the run sheet draws reckoner pictures as well).
    const readingsFigure = page.getByRole('figure').filter({ has: plot });
    await readingsFigure.getByText('The plotted figures as a table').click();
    const figures = readingsFigure.locator('[data-plot-table] table');
    await figures.waitFor();
    expect(await figures.locator('th[scope="col"]').allTextContents()).toEqual([
      'Reading',
      'Band (% of expected)',
      'Deviation from expected (%)',
      'Mark',
    ]);
    const outRow = figures.locator('tbody tr', { hasText: 'out of band' });
    expect(await outRow.count()).toBe(1);
    expect(await outRow.locator('td').nth(1).innerText()).toMatch(/^\+\d+(\.\d+)? %$/);
    expect(await figures.locator('tbody tr').count()).toBe(await plot.locator('[data-plot-point]').count());

    // 6. The PDF for the customer's file.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download PDF' }).click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/^run-sheet-TC-18-TC18-0457-.*\.pdf$/);
    const pdf = await page.request.get(`${app.url}/api/runs/${runId}/sheet.pdf`);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');

    // 7. The unit's trend of a reading across visits: a plot with its name, unit and figures.
    await page.goto(unitUrl);
    const trend = page.getByRole('img', { name: / across visits$/ });
    await trend.waitFor();
    expect(await trend.locator('[data-plot-visit]').count()).toBe(1);
    const titles = await trend.locator('text').allTextContents();
    expect(
      titles.some((t) => / \((V|A|Ω|W|Hz|F|s|%)( DC| rms| peak| peak-to-peak)?\)$/.test(t)),
      titles.join(' | '),
    ).toBe(true);
    await page.getByText('The plotted figures as a table').click();
    expect(await page.locator('[data-plot-table] tbody tr').count()).toBe(1);
    await context.close();
  });
});
