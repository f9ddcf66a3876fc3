// In Chromium: a run signed with a B+ out of band opens a follow-up (listed, counted at home); a later
// in-band run of the same procedure on the unit, signed as performed, closes it; a reviewer then signs
// that run as checked and released, and the run sheet and the unit show both signatures and the state.
import { randomUUID } from 'node:crypto';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { httpSession } from '../support/http-session';
import { demo } from '../support/test-app';

const app = useBrowserApp();
const PROCEDURE = 'TC-18 combo: first power-up';

async function startFor(page: Page, serial: string) {
  await page.goto(`${app.url}/units`);
  await page.getByRole('link', { name: serial }).click();
  await page.getByRole('link', { name: 'Start a bench run on this unit' }).click();
  const select = page.getByLabel('Approved procedure', { exact: true });
  const option = select.locator('option', { hasText: PROCEDURE });
  await option.waitFor({ state: 'attached' });
  await select.selectOption((await option.getAttribute('value'))!);
  await page.getByLabel('Measured mains (V)').fill('230 V');
  await page.getByLabel('Mains frequency (Hz)').fill('50');
  await page.getByRole('button', { name: 'Start the bench run' }).click();
  await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
  return page.url().split('/').pop()!;
}

/** Every step through the API as the performer: readings at their expected value, B+ scaled by `bplus`. */
async function enterAll(who: 'tom' | 'priya', runId: string, bplus: number) {
  const s = httpSession(app.url);
  await s.signIn(demo[who].email, demo[who].password);
  const run = (await s.get(`/api/runs/${runId}`)).body.run as {
    steps: { id: string; kind: string; reading?: { expected: number | null; unit: string } }[];
  };
  for (const step of run.steps) {
    const r = step.reading;
    const body =
      step.kind === 'reading'
        ? { value: `${(r!.expected ?? 0) * (step.id === 'tc18-rd-bplus' ? bplus : 1)} ${r!.unit}` }
        : { done: true };
    const res = await s.call('PUT', `/api/runs/${runId}/entries/${step.id}`, { key: randomUUID(), ...body });
    expect(res.status, `${step.id} ${JSON.stringify(res.body)}`).toBe(200);
  }
}

async function signPerformed(page: Page, who: 'tom' | 'priya', runId: string) {
  await page.goto(`${app.url}/runs/${runId}`);
  await page.getByLabel('Your password').fill(demo[who].password);
  await page.getByRole('button', { name: 'Sign as performed' }).click();
  await page.waitForURL(/\/sheet$/);
}

const noSideways = (page: Page) =>
  page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);

describe('release signature and follow-up, in Chromium', () => {
  it('an out-of-band run opens a follow-up, a passing re-run closes it, and a reviewer releases the re-run', async () => {
    const serial = `TC18-E${randomUUID().slice(0, 5)}`;
    const admin = httpSession(app.url);
    await admin.signIn(demo.tom.email, demo.tom.password);
    expect((await admin.post('/api/units', { model: 'TC-18', serial, owner: 'E. Test' })).status).toBe(201);

    // Tom's run: B+ 20 % low. Signed as performed in the browser, its sheet names the open follow-up.
    const tom = await app.openPage();
    await tom.setViewportSize({ width: 390, height: 900 });
    await app.signIn(tom, 'tom');
    const first = await startFor(tom, serial);
    await enterAll('tom', first, 0.8);
    await signPerformed(tom, 'tom', first);
    await tom.locator('[data-follow-up]').getByText('open', { exact: true }).first().waitFor();
    await tom.getByText('Released by').waitFor();
    await tom.goto(`${app.url}/follow-ups`);
    const card = tom.getByRole('article', { name: `Follow-up on TC-18 ${serial}` });
    await card.getByText('Open', { exact: true }).waitFor();
    expect(await card.getAttribute('data-follow-up')).toBe('open');
    expect(await noSideways(tom)).toBe(true);
    await tom.goto(app.url + '/');
    await tom.locator('[data-home-section="followUps"]').getByText(`TC-18 ${serial}`).waitFor();
    await tom.context().close();

    // Priya re-runs it in band and signs: the follow-up closes with her run.
    const priya = await app.openPage();
    await priya.setViewportSize({ width: 1024, height: 1000 });
    await app.signIn(priya, 'priya');
    const second = await startFor(priya, serial);
    await enterAll('priya', second, 1);
    await signPerformed(priya, 'priya', second);
    await priya.getByText(/This passing run closed the follow-up opened/).waitFor();
    // The performer cannot release her own run: the page says who can.
    await priya.goto(`${app.url}/runs/${second}`);
    await priya
      .getByText(/waiting for a reviewer or a qualified technician to check and release it/)
      .waitFor();
    await priya.context().close();

    // Marek releases the re-run with his password; the sheet shows both signatures, the unit is released.
    const marek = await app.openPage();
    await marek.setViewportSize({ width: 1366, height: 1000 });
    await app.signIn(marek, 'marek');
    await marek.goto(`${app.url}/runs/${second}`);
    const form = marek.getByRole('form', { name: 'Check and release' });
    await form.getByLabel('Your password').fill('not-his-password');
    await form.getByRole('button', { name: 'Sign as checked and released' }).click();
    await form.getByText(/That password is not right/).waitFor();
    await form.getByLabel('Your password').fill(demo.marek.password);
    await form.getByRole('button', { name: 'Sign as checked and released' }).click();
    await marek.locator('[data-release]').getByText('Marek Vos (reviewer)').waitFor();
    await marek.getByText('Yes: the release covers the signed run content hash.').waitFor();
    await marek.getByText('Priya Lindqvist (technician)').waitFor();
    expect(await noSideways(marek)).toBe(true);

    await marek.goto(`${app.url}/follow-ups`);
    const closed = marek.getByRole('article', { name: `Follow-up on TC-18 ${serial}` });
    await closed.getByRole('link', { name: 'the passing re-run' }).waitFor();
    expect(await closed.getAttribute('data-follow-up')).toBe('closed');
    await marek.getByRole('link', { name: serial }).first().click();
    expect(await marek.locator('[data-unit-state]').getAttribute('data-unit-state')).toBe('released');
    await marek.context().close();
  });
});
