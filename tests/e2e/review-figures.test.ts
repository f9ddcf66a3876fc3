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

/**
 * As the signed-in author, in the page: revision 2 of TC-18 with the mains fuse's transformer
 * efficiency changed and the bleeder block renamed (the reading that uses it follows), submitted.
 */
function submitEditedDraft(page: Page) {
  return page.evaluate(async () => {
    const session = await (await fetch('/api/auth/session')).json();
    const headers = { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken as string };
    const list = await (await fetch('/api/procedures')).json();
    const proc = list.procedures.find(
      (p: { equipmentModel: string; approved: unknown }) => p.equipmentModel === 'TC-18' && p.approved,
    );
    const r = (
      await (await fetch(`/api/procedures/${proc.id}/drafts`, { method: 'POST', headers, body: '{}' })).json()
    ).revision;
    const walk = (n: { type: string; attrs?: Record<string, unknown>; content?: unknown[] }) => {
      const a = n.attrs ?? {};
      if (n.type === 'reckoner' && a.name === 'fuse')
        (a.inputs as Record<string, unknown>).efficiency = '80 %';
      if (n.type === 'reckoner' && a.name === 'bleed') a.name = 'discharge';
      const expected = a.expected as { ref?: string } | undefined;
      if (n.type === 'reading' && expected?.ref?.startsWith('bleed.'))
        expected.ref = expected.ref.replace('bleed.', 'discharge.');
      (n.content ?? []).forEach((c) => walk(c as never));
    };
    walk(r.document);
    const body = {
      title: r.title,
      equipmentFamily: r.equipmentFamily,
      equipmentModel: r.equipmentModel,
      tags: r.tags,
      params: r.params,
      lockVersion: r.lockVersion,
      document: r.document,
    };
    const saved = await fetch(`/api/revisions/${r.id}`, {
      method: 'PUT',
      headers,
      body: JSON.stringify(body),
    });
    if (!saved.ok) throw new Error(`save failed: ${saved.status} ${await saved.text()}`);
    const submitted = await fetch(`/api/revisions/${r.id}/submit`, {
      method: 'POST',
      headers,
      body: JSON.stringify({ changeReason: 'Figures checked again.' }),
    });
    if (!submitted.ok) throw new Error(`submit failed: ${submitted.status} ${await submitted.text()}`);
    return r.id as string;
  });
}

describe('what was assumed, in Chromium', () => {
  it('the reader shows each reckoner’s inputs with value, measure and source beside its results', async () => {
    const page = await openPage();
    await app.signIn(page, 'tom');
    await page.goto(`${app.url}/revisions/${await approvedTc18(page)}`);
    // Blocks are shown by their labels; the internal name is only a data attribute here.
    const noLoad = page
      .locator('[data-reckoner="noLoad"]')
      .getByRole('table', { name: 'Inputs of Peak and no-load DC' });
    const winding = noLoad.getByRole('row').filter({ hasText: 'Winding voltage (rms)' });
    await winding.waitFor();
    expect(await winding.innerText()).toMatch(/290 V\s*rms[\s\S]*typed/);
    const charged = page
      .locator('[data-reckoner="bleed"]')
      .getByRole('table')
      .getByRole('row')
      .filter({ hasText: 'Charged voltage' });
    expect(await charged.innerText()).toMatch(
      /436 V\s*DC[\s\S]*“No-load DC, high end” from the Peak and no-load DC block/,
    );
    expect(await page.locator('main').innerText()).not.toMatch(/\bnoLoad\b|block “/);
    // Results stay beside the inputs, in the order the reckoner declares them.
    const results = page.locator('[data-reckoner="noLoad"] [data-output]');
    expect((await results.allInnerTexts()).slice(0, 2).map((t) => t.split('\n')[0])).toEqual([
      'Winding voltage at this mains',
      'Peak voltage',
    ]);
    await page.context().close();
  });

  it('the review page lists a changed input with its source, a rename once, and every block’s inputs', async () => {
    const author = await openPage();
    await app.signIn(author, 'hal');
    const revisionId = await submitEditedDraft(author);
    await author.context().close();

    const reviewer = await openPage();
    await app.signIn(reviewer, 'marek');
    await reviewer.goto(`${app.url}/review/revisions/${revisionId}`);
    const changes = reviewer.getByRole('table', { name: 'Value changes' });
    const efficiency = changes.getByRole('row').filter({ hasText: 'Transformer efficiency' });
    await efficiency.waitFor();
    expect(await efficiency.innerText()).toMatch(/Mains fuse[\s\S]*85 %[\s\S]*typed[\s\S]*80 %[\s\S]*typed/);
    const renamed = changes.getByRole('row').filter({ hasText: 'reference name changed' });
    expect(await renamed.count()).toBe(1);
    expect(await renamed.innerText()).toMatch(/bleed[\s\S]*discharge/);
    expect(
      await changes
        .getByRole('row')
        .filter({ hasText: /\bnew\b|\bremoved\b/ })
        .count(),
    ).toBe(0);

    // The revision as written, beside the changes, shows each block's inputs as the reader does.
    const written = reviewer.getByRole('region', { name: /^Revision \d+ as written$/ });
    const actual = written
      .locator('[data-reckoner="noLoad"]')
      .getByRole('table')
      .getByRole('row')
      .filter({ hasText: 'Actual mains' });
    expect(await actual.innerText()).toMatch(/230 V\s*rms[\s\S]*procedure parameter “Measured mains”/);
    await reviewer.context().close();
  });
});
