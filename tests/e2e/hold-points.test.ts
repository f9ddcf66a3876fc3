// A hold point reached out of band stops the bench run until a reviewer decides; a deviation is
// approved by a reviewer before the technician signs; both are on the run sheet.
import { randomUUID } from 'node:crypto';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { createDb, createPool } from '../../server/db/client';
import { paths } from '../../shared/paths';
import { useBrowserApp } from '../support/e2e';
import { httpSession } from '../support/http-session';
import { procedureInState } from '../support/review-path';
import { demo } from '../support/test-app';
import { benchDoc } from '../server/modules/runs/runs-fixtures';

const app = useBrowserApp();

async function fitsAt(page: Page, width: number) {
  await page.setViewportSize({ width, height: 900 });
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(overflow, `page wider than ${width} px`).toBeLessThanOrEqual(0);
}

/** An approved procedure whose heater reading (6.3 V ± 0.3 V) is a hold point, and Priya's run on it up to that reading. */
async function runStoppedAtHoldPoint() {
  const pool = createPool(app.databaseUrl);
  const document = structuredClone(benchDoc);
  for (const n of document.content!)
    if (n.type === 'reading' && n.attrs?.id === 'rd-heater') n.attrs.holdPoint = true;
  const { revision } = await procedureInState(createDb(pool), 'approved', {
    title: 'TC-18 heater check with a hold point',
    equipmentFamily: 'Guitar amplifier',
    equipmentModel: 'TC-18',
    tags: [],
    params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
    document,
  }).finally(() => pool.end());
  const priya = httpSession(app.url);
  expect((await priya.signIn(demo.priya.email, demo.priya.password)).status).toBe(200);
  const unit = await priya.post('/api/units', {
    model: 'TC-18',
    serial: `TC18-H${randomUUID().slice(0, 5)}`,
  });
  const run = await priya.post('/api/runs', {
    revisionId: revision.id,
    unitId: (unit.body.unit as { id: string }).id,
    mainsVoltage: 230,
    mainsFrequency: 50,
  });
  expect(run.status).toBe(201);
  const runId = (run.body.run as { id: string }).id;
  for (const [step, body] of [
    ['hz-ht-live', { done: true }],
    ['rd-ht-ac', { value: '251 V' }],
    ['rd-heater', { value: '7.2 V' }],
  ] as const) {
    const res = await priya.call('PUT', `/api/runs/${runId}/entries/${step}`, { key: randomUUID(), ...body });
    expect(res.status).toBe(200);
  }
  return runId;
}

describe('hold points and deviations in Chromium', () => {
  it('a reviewer decides the hold, approves the deviation, and the technician signs', async () => {
    const runId = await runStoppedAtHoldPoint();

    // The technician's bench, on a phone: the run is stopped, saying why and who decides.
    const bench = await app.openPage();
    await bench.setViewportSize({ width: 390, height: 900 });
    await app.signIn(bench, 'priya');
    await bench.goto(app.url + paths.run.href(runId));
    const banner = bench.locator('[data-hold-point-banner]');
    await banner.waitFor();
    expect(await banner.innerText()).toMatch(
      /Stopped at a hold point: step 3, Heater winding, measured 7\.2 V/,
    );
    expect(await banner.innerText()).toMatch(/reviewer or an admin who is not performing the run/);
    expect(await banner.getByRole('form', { name: 'Decide the hold point' }).count()).toBe(0);
    await bench.locator('[data-step-id="rd-heater"] [data-hold-point-marker]').waitFor();
    await fitsAt(bench, 390);

    // The reviewer finds it on the home page and decides to continue, with a reason.
    const desk = await app.openPage();
    await desk.setViewportSize({ width: 1366, height: 900 });
    await app.signIn(desk, 'marek');
    const waiting = desk.locator('[data-home-section="decisions"]');
    await waiting.getByRole('link', { name: /hold point at step 3/ }).click();
    await desk.waitForURL(new RegExp(`/runs/${runId}$`));
    const decide = desk.getByRole('form', { name: 'Decide the hold point' });
    await decide.getByLabel('Continue the run').check();
    await decide
      .getByLabel('Reason for the decision')
      .fill('Heater tap reads high on this transformer; carry on.');
    await decide.getByRole('button', { name: 'Record the decision' }).click();
    await desk.locator('[data-hold-point-banner]').waitFor({ state: 'detached' });
    await fitsAt(desk, 1024);

    // The technician records the last step as done another way.
    await bench.reload();
    await bench.locator('[data-step-id="rd-heater"]').waitFor();
    expect(await bench.locator('[data-hold-point-banner]').count()).toBe(0);
    const step = bench.locator('[data-step-id="ck-discharge"]');
    await step.getByRole('button', { name: 'Not applicable, or done another way…' }).click();
    await step.getByLabel('Done another way (deviation)').check();
    await step
      .getByLabel('What was done instead, and why')
      .fill('Discharged through the probe and read 2 V on the meter instead of the bleeder wait.');
    await step.getByRole('button', { name: 'Record', exact: true }).click();
    await step
      .locator('[data-step-record="deviation"]')
      .getByText(/waiting for a reviewer/)
      .waitFor();
    await bench.locator('[data-sign-waiting]').waitFor();

    // The reviewer approves it.
    await desk.reload();
    const approve = desk.getByRole('form', { name: 'Decide the deviation on step 4' });
    await approve.getByLabel('Approve').check();
    await approve.getByLabel('Note on the decision').fill('Probe discharge with a reading is fine here.');
    await approve.getByRole('button', { name: 'Record the decision' }).click();
    await desk.locator('[data-deviations-waiting]').waitFor({ state: 'detached' });

    // The technician signs; the sheet shows the hold decided and the deviation approved.
    await bench.reload();
    await bench.getByLabel('Your password').fill(demo.priya.password);
    await bench.getByRole('button', { name: 'Sign as performed' }).click();
    await bench.waitForURL(new RegExp(`/runs/${runId}/sheet$`));
    const records = bench.locator('[data-sheet-decisions]');
    await records.waitFor();
    const text = await records.innerText();
    expect(text).toMatch(/Marek Vos decided to continue.*Heater tap reads high/s);
    expect(text).toMatch(/Deviation.*Discharged through the probe.*Approved by Marek Vos/s);
    await fitsAt(bench, 390);
  });
});
