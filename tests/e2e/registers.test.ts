// In Chromium: an instrument past its calibration due date is refused with its reason where it is
// chosen, and a trainee's bench run is started with a witness, co-signed by them, then signed.
import { randomUUID } from 'node:crypto';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { httpSession } from '../support/http-session';
import { demo } from '../support/test-app';

const app = useBrowserApp();

interface Instrument {
  id: string;
  identifier: string;
  refusal: string | null;
}

async function instruments() {
  const tom = httpSession(app.url);
  await tom.signIn(demo.tom.email, demo.tom.password);
  return (await tom.get('/api/instruments')).body.instruments as Instrument[];
}

async function startFor(page: Page, unitSerial: string, procedureTitle: string) {
  await page.goto(app.url + '/units');
  await page.getByRole('link', { name: unitSerial }).click();
  await page.getByRole('link', { name: 'Start a bench run on this unit' }).click();
  const select = page.getByLabel('Approved procedure', { exact: true });
  const option = select.locator('option', { hasText: procedureTitle });
  await option.waitFor({ state: 'attached' });
  await select.selectOption((await option.getAttribute('value'))!);
  await page.getByLabel('Measured mains (V)').fill('232 V');
  await page.getByLabel('Mains frequency (Hz)').fill('50');
}

describe('instruments and qualifications at the bench, in Chromium', () => {
  it('an instrument past its due date is shown disabled with the reason, and the server’s refusal appears beside the field', async () => {
    const all = await instruments();
    const overdue = all.find((i) => i.identifier === 'TC-IR-01')!;
    expect(overdue.refusal).not.toBeNull();
    const page = await app.openPage();
    await page.setViewportSize({ width: 390, height: 900 });
    await app.signIn(page, 'tom');
    await page.goto(app.url + '/instruments');
    await expect
      .poll(() => page.locator('[data-instrument="TC-IR-01"] [data-refusal]').textContent())
      .toBe('Past due: cannot take readings');

    await startFor(page, 'TC18-0203', 'TC-18 combo: first power-up');
    const choice = page.getByLabel('Usual instrument for this run');
    const option = choice.locator(`option[value="${overdue.id}"]`);
    expect(await option.isDisabled()).toBe(true);
    expect(await option.textContent()).toMatch(
      /TC-IR-01 .* — cannot be chosen: past its calibration due date/,
    );

    // A device that remembers the overdue one as its usual instrument: the server refuses it and says why.
    await page.evaluate((id) => localStorage.setItem('bw.usual-instrument', id), overdue.id);
    await page.reload();
    const select = page.getByLabel('Approved procedure', { exact: true });
    const again = select.locator('option', { hasText: 'TC-18 combo: first power-up' });
    await again.waitFor({ state: 'attached' });
    await select.selectOption((await again.getAttribute('value'))!);
    await page.getByLabel('Measured mains (V)').fill('232 V');
    await page.getByLabel('Mains frequency (Hz)').fill('50');
    await page.getByRole('button', { name: 'Start the bench run' }).click();
    await page
      .getByText(
        /TC-IR-01 was due for calibration on \d{4}-\d{2}-\d{2}; it cannot take readings until it is calibrated again/,
      )
      .waitFor();
    expect(page.url()).toMatch(/\/runs\/new/);
    await page.context().close();
  });

  it('a trainee’s run: refused alone with the reason, started with a witness, co-signed by the witness, then signed by the trainee', async () => {
    const page = await app.openPage();
    await page.setViewportSize({ width: 1024, height: 1000 });
    await app.signIn(page, 'sam');
    await startFor(page, 'TC5R-0088', 'TC-5R table radio: rectifier and filter capacitor replacement');
    await page
      .locator('[data-not-qualified]')
      .getByText(
        'You are not qualified for Table radio procedures; a run of this procedure needs a qualified witness who co-signs it.',
      )
      .waitFor();
    await page.getByRole('button', { name: 'Start the bench run' }).click();
    await page.getByText('name a qualified witness who will co-sign the run').waitFor();
    await page.getByLabel('Witness', { exact: true }).selectOption({ label: 'Tom Achterberg' });
    const usual = page.getByLabel('Usual instrument for this run');
    await usual.selectOption({
      label: (await usual.locator('option', { hasText: 'TC-DMM-01' }).textContent())!,
    });
    await page.getByRole('button', { name: 'Start the bench run' }).click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    const runId = page.url().split('/').pop()!;
    await page
      .locator('[data-witness-waiting]')
      .getByText(/Tom Achterberg witnesses this run/)
      .waitFor();

    // The steps themselves, entered through the API as the trainee (each reading at its expected value).
    const sam = httpSession(app.url);
    await sam.signIn(demo.sam.email, demo.sam.password);
    const run = (await sam.get(`/api/runs/${runId}`)).body.run as {
      steps: { id: string; kind: string; reading?: { expected: number | null } }[];
    };
    for (const s of run.steps) {
      const body = s.kind === 'reading' ? { value: s.reading!.expected } : { done: true };
      const res = await sam.call('PUT', `/api/runs/${runId}/entries/${s.id}`, { key: randomUUID(), ...body });
      expect(res.status, `${s.id} ${JSON.stringify(res.body)}`).toBe(200);
    }

    // The witness co-signs from their own session.
    const tomPage = await app.openPage();
    await tomPage.setViewportSize({ width: 390, height: 900 });
    await app.signIn(tomPage, 'tom');
    await tomPage.goto(`${app.url}/runs/${runId}`);
    const form = tomPage.getByRole('form', { name: 'Co-sign as witness' });
    await form.getByLabel('Your password').fill(demo.tom.password);
    await form.getByRole('button', { name: 'Sign as witnessed' }).click();
    await tomPage.locator('[data-witness]').getByText('Tom Achterberg', { exact: true }).waitFor();
    await tomPage.context().close();

    // The trainee signs after the witness.
    await page.reload();
    await page.getByLabel('Your password').fill(demo.sam.password);
    await page.getByRole('button', { name: 'Sign as performed' }).click();
    await page.waitForURL(/\/sheet$/);
    await page.locator('[data-witness]').getByText('Tom Achterberg', { exact: true }).waitFor();
    await page.getByText('Yes: co-signed over the run content as it stands.').waitFor();
    await page
      .locator('[data-sheet-instruments]')
      .getByText(/TC-DMM-01 \(meter\)/)
      .waitFor();
    await page.context().close();
  });
});
