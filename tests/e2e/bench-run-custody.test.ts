import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { httpSession } from '../support/http-session';
import { demo } from '../support/test-app';

const app = useBrowserApp();
const { cspViolations } = app;

async function signIn(page: Page, who: 'tom' | 'priya') {
  await page.goto(app.url + '/sign-in');
  await page.getByLabel('E-mail').fill(demo[who].email);
  await page.getByLabel('Password').fill(demo[who].password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { name: 'My bench runs in progress' }).waitFor();
}

async function signOut(page: Page) {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(/\/sign-in/);
}

/** The run as the server has it, read with the tab's own session. */
async function entriesOf(page: Page, runId: string) {
  const res = await page.request.get(`${app.url}/api/runs/${runId}`);
  expect(res.status()).toBe(200);
  return (
    (await res.json()) as { run: { entries: { stepId: string; enteredBy: { displayName: string } }[] } }
  ).run.entries;
}

let runId = '';

describe('who a bench run belongs to, in Chromium', () => {
  it('an entry Tom queued is never sent as Priya after she signs in in another tab; it waits for Tom and then goes as his', async () => {
    const context = await app.browser.newContext({ viewport: { width: 1024, height: 1000 } });
    const tab1 = await context.newPage();
    const tab2 = await context.newPage();
    for (const p of [tab1, tab2]) {
      p.on('console', (m) => {
        if (/Content.Security.Policy/i.test(m.text())) cspViolations.push(m.text().slice(0, 160));
      });
    }

    // Tab 1: Tom starts a bench run on a demo unit.
    await signIn(tab1, 'tom');
    await tab1.getByRole('link', { name: 'Units', exact: true }).click();
    await tab1.getByRole('link', { name: 'TC18-0142' }).click();
    await tab1.getByRole('link', { name: 'Start a bench run on this unit' }).click();
    const select = tab1.getByLabel('Approved procedure', { exact: true });
    const option = select.locator('option', { hasText: 'TC-18 combo: first power-up' });
    await option.waitFor({ state: 'attached' });
    await select.selectOption((await option.getAttribute('value'))!);
    await tab1.getByLabel('Measured mains (V)').fill('231 V');
    await tab1.getByLabel('Mains frequency (Hz)').fill('50');
    await tab1.getByRole('button', { name: 'Start the bench run' }).click();
    await tab1.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    runId = tab1.url().split('/').pop()!;
    const first = tab1.locator('[data-step-id]').first();
    const stepId = (await first.getAttribute('data-step-id'))!;

    // The entry cannot reach the server for now: it is kept on the tablet as Tom's.
    const entryUrl = `**/api/runs/${runId}/entries/**`;
    await tab1.route(entryUrl, (route) => route.abort('internetdisconnected'));
    await first.getByRole('button', { name: 'I have read this hazard note' }).click();
    await first.locator('[data-pending="true"]').waitFor();

    // Tab 2: Tom signs out, Priya signs in (same browser, same cookies).
    await tab2.goto(app.url + '/');
    await tab2.getByRole('heading', { name: 'My bench runs in progress' }).waitFor();
    await signOut(tab2);
    await signIn(tab2, 'priya');

    // The server is reachable again. Tab 1 still holds Tom's stale token; the answer is 403 (CSRF),
    // and the session is now Priya's: the entry must stay queued, saying why, and must not be sent.
    await tab1.unroute(entryUrl);
    await tab1
      .getByText(
        'Signed in as Priya Lindqvist; this entry was made by Tom Achterberg — sign in as Tom Achterberg to send it.',
      )
      .first()
      .waitFor({ timeout: 15_000 });
    await tab1.waitForTimeout(5_000); // another round of the queue's retries
    expect(await entriesOf(tab2, runId)).toEqual([]);
    await tab1.getByText('this entry was made by Tom Achterberg').first().waitFor();

    // Tom signs in again in tab 2: tab 1 sends the entry, as Tom.
    await signOut(tab2);
    await signIn(tab2, 'tom');
    await tab1.locator(`[data-step-id="${stepId}"] [data-saved]`).waitFor({ timeout: 20_000 });
    const entries = await entriesOf(tab2, runId);
    expect(entries.map((e) => [e.stepId, e.enteredBy.displayName])).toEqual([[stepId, 'Tom Achterberg']]);
    await context.close();
  });

  it('Tom hands the run over to Priya with the button; when the revision is withdrawn her bench shows the hold and she closes the run as abandoned', async () => {
    const tom = await app.openPage();
    await signIn(tom, 'tom');
    await tom.goto(`${app.url}/runs/${runId}`);
    const handover = tom.getByRole('form', { name: 'Hand over this run' });
    const technician = handover.getByLabel('Technician');
    await technician.locator('option', { hasText: 'Priya Lindqvist' }).waitFor({ state: 'attached' });
    await technician.selectOption({ label: 'Priya Lindqvist' });
    await handover.getByLabel('Reason for the handover').fill('End of my shift; Priya carries on.');
    await handover.getByRole('button', { name: 'Hand over the run' }).click();
    await tom.getByText('Priya Lindqvist is performing this bench run').waitFor();
    await tom
      .locator('[data-handover]')
      .getByText('Tom Achterberg handed the run over to Priya Lindqvist')
      .waitFor();

    // Priya's bench: the checklist is hers now; Tom's acknowledgement stays his on the sheet.
    const priya = await app.openPage();
    await signIn(priya, 'priya');
    await priya.goto(`${app.url}/runs/${runId}`);
    const next = priya.locator('[data-step-kind="hazard"]').nth(1);
    await next.getByRole('button', { name: 'I have read this hazard note' }).click();
    await next.getByText('Saved by Priya Lindqvist').waitFor();
    await priya.locator('[data-step-kind="hazard"]').first().getByText('Saved by Tom Achterberg').waitFor();

    // A reviewer withdraws the revision: the bench shows the hold with the reason, and the checklist goes.
    const marek = httpSession(app.url);
    expect((await marek.signIn(demo.marek.email, demo.marek.password)).status).toBe(200);
    const run = (await marek.get(`/api/runs/${runId}`)).body.run as { revision: { id: string } };
    const revision = (await marek.get(`/api/revisions/${run.revision.id}`)).body.revision as {
      procedureId: string;
    };
    const reason = 'Wrong bleeder value, do not use.';
    expect(
      (
        await marek.post(`/api/procedures/${revision.procedureId}/withdraw`, {
          password: demo.marek.password,
          reason,
        })
      ).status,
    ).toBe(200);
    await priya.locator('[data-hold]').getByText(`Reason: ${reason}`).waitFor({ timeout: 10_000 });
    expect(await priya.locator('[data-step-id]').count()).toBe(0);

    const close = priya.getByRole('form', { name: 'Close this run as abandoned' });
    await close.getByLabel('Reason for closing').fill('Procedure withdrawn; unit back on the shelf.');
    await close.getByRole('button', { name: 'Close as abandoned' }).click();
    await priya.locator('[data-run-abandoned]').waitFor();
    await priya.getByText('as abandoned: Procedure withdrawn; unit back on the shelf.').waitFor();
  });

  it('the pages run under the strict Content-Security-Policy with no violations', () => {
    expect(cspViolations).toEqual([]);
  });
});
