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

/** The approved revision of the seeded procedure for `model` whose title contains `title`. */
const approvedOf = (page: Page, model: string, title = '') =>
  page.evaluate(
    async ([model, title]) => {
      const list = await (await fetch('/api/procedures')).json();
      return list.procedures.find(
        (p: { equipmentModel: string; title: string; approved: unknown }) =>
          p.equipmentModel === model && p.title.includes(title!) && p.approved,
      ).approved.id as string;
    },
    [model, title],
  );

/** A picture by its accessible name: its description has figures, its axis titles the units, and it has a table. */
async function expectPicture(page: Page, p: { name: string; units: string[] }) {
  const svg = page.getByRole('img', { name: p.name, exact: true });
  await svg.waitFor();
  const description = await svg.evaluate(
    (el) => document.getElementById(el.getAttribute('aria-describedby')!)!.textContent!,
  );
  expect(description, p.name).toMatch(/\d+(\.\d+)? (V|s|A|mA)\b/);
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
    for (const p of PICTURES) await expectPicture(page, p);
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

  it('draws the choke-input, part-ratings and rectifier-substitution pictures with their data and units', async () => {
    const page = await openPage();
    await app.signIn(page, 'tom');
    await page.goto(`${app.url}/revisions/${await approvedOf(page, 'TC-35M')}`);
    await expectPicture(page, {
      name: 'choke: output voltage against load current',
      units: ['(mA DC)', '(V DC)'],
    });
    const choke = page.getByRole('img', { name: 'choke: output voltage against load current', exact: true });
    // The knee (critical current) and the lightest load are marked.
    expect(await choke.locator('[data-mark="knee"]').count()).toBe(1);
    await expectPicture(page, {
      name: 'ratings: each part’s stress against its rating at high mains',
      units: ['(% of the rating)'],
    });
    const ratings = page.getByRole('img', {
      name: 'ratings: each part’s stress against its rating at high mains',
      exact: true,
    });
    expect(await ratings.locator('[data-bar]').count()).toBeGreaterThanOrEqual(5);
    await page.goto(`${app.url}/revisions/${await approvedOf(page, 'TC-5R', 'silicon')}`);
    await expectPicture(page, { name: 'sub: B+ at each node, before and after', units: ['(V DC)'] });
    await page.context().close();
  });

  it('the review page draws a changed block’s picture before and after', async () => {
    const author = await openPage();
    await app.signIn(author, 'hal');
    const revisionId = await author.evaluate(async () => {
      const session = await (await fetch('/api/auth/session')).json();
      const headers = { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken as string };
      const list = await (await fetch('/api/procedures')).json();
      const proc = list.procedures.find(
        (p: { equipmentModel: string; approved: unknown }) => p.equipmentModel === 'TC-35M' && p.approved,
      );
      const r = (
        await (
          await fetch(`/api/procedures/${proc.id}/drafts`, { method: 'POST', headers, body: '{}' })
        ).json()
      ).revision;
      const walk = (n: { type: string; attrs?: Record<string, unknown>; content?: unknown[] }) => {
        if (n.type === 'reckoner' && n.attrs?.name === 'choke')
          (n.attrs.inputs as Record<string, unknown>).lightestLoad = '40 mA';
        (n.content ?? []).forEach((c) => walk(c as never));
      };
      walk(r.document);
      const { title, equipmentFamily, equipmentModel, tags, params, lockVersion, document } = r;
      const saved = await fetch(`/api/revisions/${r.id}`, {
        method: 'PUT',
        headers,
        body: JSON.stringify({ title, equipmentFamily, equipmentModel, tags, params, lockVersion, document }),
      });
      if (!saved.ok) throw new Error(`save failed: ${saved.status} ${await saved.text()}`);
      const submitted = await fetch(`/api/revisions/${r.id}/submit`, {
        method: 'POST',
        headers,
        body: JSON.stringify({ changeReason: 'A heavier bleeder.' }),
      });
      if (!submitted.ok) throw new Error(`submit failed: ${submitted.status} ${await submitted.text()}`);
      return r.id as string;
    });
    await author.context().close();

    const reviewer = await openPage();
    await app.signIn(reviewer, 'marek');
    await reviewer.goto(`${app.url}/review/revisions/${revisionId}`);
    const units = ['(mA DC)', '(V DC)'];
    await expectPicture(reviewer, {
      name: 'Before: revision 1: choke: output voltage against load current',
      units,
    });
    await expectPicture(reviewer, {
      name: 'After: revision 2: choke: output voltage against load current',
      units,
    });
    const pair = reviewer.locator('[data-plot-pair]');
    expect(await pair.count(), 'only the changed block').toBe(1);
    // The lightest load moved from 19 mA to 40 mA: the two tables say so.
    const tables = await pair.locator('figure table').allInnerTexts();
    expect(tables[0]).toMatch(/Lightest load\s+19 mA/);
    expect(tables[1]).toMatch(/Lightest load\s+40 mA/);
    await reviewer.context().close();
  });

  it('the run sheet draws the ladder and the discharge at the run’s measured mains', async () => {
    const page = await openPage();
    await app.signIn(page, 'tom');
    // A seeded TC18-0142 run, with the mains measured on it (226–238 V in the demo runs).
    const { runId, mains } = await page.evaluate(async () => {
      const list = await (await fetch('/api/runs')).json();
      const id = list.runs.find(
        (r: { status: string; unit: { serial: string } }) =>
          r.unit.serial === 'TC18-0142' && r.status === 'signed',
      ).id as string;
      const run = (await (await fetch(`/api/runs/${id}`)).json()).run;
      return { runId: id, mains: run.params.mainsVoltage as number };
    });
    expect(mains).not.toBe(230);
    await page.goto(`${app.url}/runs/${runId}/sheet`);
    const at = `(at ${mains} V mains)`;
    await expectPicture(page, { name: `ladder: node voltages down the ladder ${at}`, units: ['(V DC)'] });
    await expectPicture(page, { name: `bleed: discharge after switch-off ${at}`, units: ['(s)', 'V DC'] });
    await page.context().close();
  });
});
