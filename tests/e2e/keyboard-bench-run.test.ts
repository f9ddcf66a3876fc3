import type { Locator, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { demo } from '../support/test-app';

const app = useBrowserApp();

/** As the signed-in technician, in the page: a new unit and a bench run on the approved bleeder retrofit. */
function startRun(page: Page, serial = 'TC30H-0815') {
  return page.evaluate(async (serial) => {
    const session = await (await fetch('/api/auth/session')).json();
    const headers = { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken as string };
    const list = await (await fetch('/api/procedures')).json();
    const proc = list.procedures.find(
      (p: { title: string; approved: unknown }) => /bleeder resistor retrofit/.test(p.title) && p.approved,
    );
    const unit = await (
      await fetch('/api/units', {
        method: 'POST',
        headers,
        body: JSON.stringify({ model: 'TC-30H', serial }),
      })
    ).json();
    const run = await fetch('/api/runs', {
      method: 'POST',
      headers,
      body: JSON.stringify({
        revisionId: proc.approved.id,
        unitId: unit.unit.id,
        mainsVoltage: 121,
        mainsFrequency: 60,
      }),
    });
    if (!run.ok) throw new Error(`start failed: ${run.status} ${await run.text()}`);
    return ((await run.json()).run as { id: string }).id;
  }, serial);
}

/**
 * What the focused element shows: whether it has a visible focus indicator (an outline or ring of
 * its own, or on the label that draws a visually hidden control), and a short description.
 */
const focusState = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { onBody: true, visible: false, what: 'body' };
    const drawn = (e: Element) => {
      const s = getComputedStyle(e);
      const r = e.getBoundingClientRect();
      const ring =
        (s.outlineStyle !== 'none' && parseFloat(s.outlineWidth) >= 2) ||
        (s.boxShadow !== 'none' && s.boxShadow !== '');
      return ring && r.width > 2 && r.height > 2;
    };
    const visible = drawn(el) || (!!el.closest('label') && drawn(el.closest('label')!));
    const what = `${el.tagName.toLowerCase()} ${el.getAttribute('aria-label') ?? el.textContent?.trim().slice(0, 40) ?? ''}`;
    return { onBody: false, visible, what };
  });

describe('a bench run, keyboard only', () => {
  it('acknowledges hazard notes, ticks check steps, records readings and signs with Tab, Enter, Space and typing', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'tom');
    const runId = await startRun(page);
    await page.goto(`${app.url}/runs/${runId}`);
    await page.locator('[data-progress]').waitFor();
    const steps = await page.$$eval('[data-step-id]', (els) =>
      els.map((e) => ({
        id: (e as HTMLElement).dataset.stepId!,
        kind: (e as HTMLElement).dataset.stepKind!,
      })),
    );
    expect(steps.length).toBeGreaterThan(5);

    const unringed = new Set<string>();
    /** Tabs forward until `target` has the focus; every element passed on the way must show it has focus. */
    async function tabTo(target: Locator, max = 80) {
      for (let i = 0; i < max; i++) {
        await page.keyboard.press('Tab');
        const f = await focusState(page);
        if (!f.onBody && !f.visible) unringed.add(f.what);
        if (await target.evaluate((e) => e === document.activeElement)) return;
      }
      throw new Error(`Tab did not reach ${target.toString()} within ${max} presses`);
    }
    /** After an entry is saved, the focus stays in its step: the next Tab goes on from there. */
    async function focusStaysIn(card: Locator) {
      expect(await card.evaluate((c) => c.contains(document.activeElement))).toBe(true);
    }

    for (const step of steps) {
      const card = page.locator(`[data-step-id="${step.id}"]`);
      if (step.kind === 'hazard') {
        await tabTo(card.getByRole('button', { name: 'I have read this hazard note' }));
        await page.keyboard.press('Enter');
        await card.getByRole('button', { name: '✓ Hazard note acknowledged' }).waitFor();
      } else if (step.kind === 'check') {
        await tabTo(card.getByRole('button', { name: 'Mark as done' }));
        await page.keyboard.press('Space');
        await card.getByRole('button', { name: /Done/ }).waitFor();
      } else {
        const band = await card.locator('[data-band]').getAttribute('data-band');
        const [low, high] = (band || '0:2').split(':').map(Number) as [number, number];
        await tabTo(card.getByRole('textbox', { name: /^Measured:/ }));
        await page.keyboard.type(((low + high) / 2).toPrecision(5));
        await page.keyboard.press('Enter');
      }
      await card.locator('[data-saved]').waitFor();
      await focusStaysIn(card);
    }
    await page.locator('[data-pending-count]').waitFor({ state: 'detached' });
    expect(await page.locator('[data-progress]').innerText()).toBe(
      `${steps.length} of ${steps.length} steps`,
    );

    // The signing panel: password, then Enter.
    await tabTo(page.getByLabel('Your password'));
    await page.keyboard.type(demo.tom.password);
    await page.keyboard.press('Enter');
    await page.waitForURL(new RegExp(`/runs/${runId}/sheet$`));
    await page.getByRole('heading', { name: /^Run sheet:/ }).waitFor();

    // Shift+Tab walks back with the focus shown as well.
    for (let i = 0; i < 5; i++) {
      await page.keyboard.press('Shift+Tab');
      const f = await focusState(page);
      if (!f.onBody && !f.visible) unringed.add(f.what);
    }
    expect([...unringed]).toEqual([]);
    await page.context().close();
  });

  it('one step at a time: Next walks to the last step and keeps the focus there, saying why it goes no further', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'tom');
    const runId = await startRun(page, 'TC30H-0816');
    await page.goto(`${app.url}/runs/${runId}`);
    await page.locator('[data-progress]').waitFor();
    const total = Number(/of (\d+) steps/.exec(await page.locator('[data-progress]').innerText())![1]);
    const oneByOne = page.getByRole('button', { name: 'One step at a time' });
    await oneByOne.focus();
    await page.keyboard.press('Enter');
    expect(await oneByOne.getAttribute('aria-pressed')).toBe('true');
    const next = page.getByRole('button', { name: 'Next step →' });
    await next.focus();
    for (let i = 1; i < total; i++) await page.keyboard.press('Enter');
    await page
      .locator('[data-step-id]')
      .filter({ hasText: `Step ${total}` })
      .waitFor();
    expect(await next.evaluate((e) => e === document.activeElement)).toBe(true);
    expect(await next.getAttribute('aria-disabled')).toBe('true');
    const why = await next.getAttribute('aria-describedby');
    expect(await page.locator(`[id="${why}"]`).innerText()).toBe('This is the last step.');
    await page.context().close();
  });
});
