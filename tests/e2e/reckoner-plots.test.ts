import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';

const app = useBrowserApp();
const { openPage } = app;

/** The seeded TC-18 procedure's approved revision id, read through the API as the signed-in person. */
const approvedTc18 = (page: Page) =>
  page.evaluate(async () => {
    const list = await (await fetch('/api/procedures')).json();
    return list.procedures.find(
      (p: { equipmentModel: string; approved: unknown }) => p.equipmentModel === 'TC-18' && p.approved,
    ).approved.id as string;
  });

/** Each picture the TC-18 reader draws: its accessible name, and the units its axis titles must carry. */
const PICTURES = [
  { name: 'bplus: reservoir voltage over two ripple periods', units: ['(ms)', '(V DC)'] },
  { name: 'ladder: node voltages down the ladder', units: ['(V DC)'] },
  { name: 'bleed: discharge after switch-off', units: ['(s)', 'V DC'] },
  { name: 'heaters: heater current against the winding rating', units: ['(A rms)'] },
];

describe('reckoner pictures in the reader, in Chromium', () => {
  it('draws each picture with its name, a description with figures, axis units and the figures as a table', async () => {
    const page = await openPage();
    await app.signIn(page, 'tom');
    await page.goto(`${app.url}/revisions/${await approvedTc18(page)}`);
    for (const p of PICTURES) {
      const svg = page.getByRole('img', { name: p.name, exact: true });
      await svg.waitFor();
      const description = await svg.evaluate(
        (el) => document.getElementById(el.getAttribute('aria-describedby')!)!.textContent!,
      );
      expect(description, p.name).toMatch(/\d+(\.\d+)? (V|s|A)\b/);
      const text = await svg.evaluate((el) =>
        [...el.querySelectorAll('text')].map((t) => t.textContent).join('|'),
      );
      for (const unit of p.units) expect(text, `${p.name}: axis titles`).toContain(unit);
      // Marks were drawn, not just the frame.
      expect(await svg.locator('polyline, [data-bar]').count(), p.name).toBeGreaterThan(0);
      const figure = page.locator('figure').filter({ has: svg });
      await figure.getByText('The plotted figures as a table').click();
      expect(await figure.getByRole('row').count(), p.name).toBeGreaterThan(1);
    }
  });

  it('draws the same picture in the editor’s reckoner card, from the live evaluation', async () => {
    const page = await openPage();
    await app.signIn(page, 'hal');
    const draftId = await page.evaluate(async () => {
      const session = await (await fetch('/api/auth/session')).json();
      const list = await (await fetch('/api/procedures')).json();
      const proc = list.procedures.find(
        (p: { equipmentModel: string; approved: unknown }) => p.equipmentModel === 'TC-18' && p.approved,
      );
      const made = await fetch(`/api/procedures/${proc.id}/drafts`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken as string },
        body: '{}',
      });
      return (await made.json()).revision.id as string;
    });
    await page.goto(`${app.url}/revisions/${draftId}/edit`);
    const ladder = page.getByRole('img', { name: PICTURES[1]!.name, exact: true });
    await ladder.waitFor();
    // The readings' bands on the ladder's nodes come from the editor's own evaluation.
    expect(await ladder.locator('[data-band]').count()).toBeGreaterThan(0);
  });
});
