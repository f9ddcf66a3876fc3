import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { demo } from '../support/test-app';

const app = useBrowserApp();
const { cspViolations, openPage } = app;

async function signIn(page: Page, who: keyof typeof demo) {
  await app.signIn(page, who);
  await page.getByRole('button', { name: 'Sign out' }).waitFor();
}

/**
 * As the signed-in author, in the page: start revision 2 of the seeded TC-18 procedure and widen
 * one reading's tolerance, through the same API the editor uses. Returns the new revision's id.
 */
function startEditedDraft(page: Page) {
  return page.evaluate(async () => {
    const session = await (await fetch('/api/auth/session')).json();
    const headers = { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken as string };
    const list = await (await fetch('/api/procedures')).json();
    const proc = list.procedures.find(
      (p: { equipmentModel: string; approved: unknown }) => p.equipmentModel === 'TC-18' && p.approved,
    );
    const draft = await (
      await fetch(`/api/procedures/${proc.id}/drafts`, { method: 'POST', headers, body: '{}' })
    ).json();
    const r = draft.revision;
    const walk = (n: { type: string; attrs?: Record<string, unknown>; content?: unknown[] }): boolean => {
      if (n.type === 'reading' && n.attrs?.id === 'tc18-rd-mains') {
        n.attrs.tolerance = '±12 %';
        return true;
      }
      return (n.content ?? []).some((c) => walk(c as never));
    };
    walk(r.document);
    const saved = await fetch(`/api/revisions/${r.id}`, {
      method: 'PUT',
      headers,
      body: JSON.stringify({
        title: r.title,
        equipmentFamily: r.equipmentFamily,
        equipmentModel: r.equipmentModel,
        tags: r.tags,
        params: r.params,
        lockVersion: r.lockVersion,
        document: r.document,
      }),
    });
    if (!saved.ok) throw new Error(`save failed: ${saved.status} ${await saved.text()}`);
    return r.id as string;
  });
}

describe('review and sign-off in Chromium', () => {
  it('an author submits a draft; a reviewer finds it in the queue, sees the changed values, approves with a password', async () => {
    const author = await openPage();
    await signIn(author, 'hal');
    const revisionId = await startEditedDraft(author);
    await author.goto(`${app.url}/review/revisions/${revisionId}`);
    // No reason, no submission: the field says so.
    await author.getByRole('button', { name: 'Submit for review' }).click();
    await author.getByText('Change reason is required').waitFor();
    await author.getByLabel('Change reason').fill('Tolerance on B+2 tightened after bench reports');
    await author.getByRole('button', { name: 'Submit for review' }).click();
    await author.getByText('Submitted. The reviewers have been told').waitFor();
    await author.context().close();

    const reviewer = await openPage();
    await signIn(reviewer, 'marek');
    await reviewer
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Review queue', exact: true })
      .click();
    const queue = reviewer.getByRole('table', { name: 'Review queue' });
    await queue.waitFor();
    const row = queue.getByRole('row').filter({ hasText: 'Hal Brennan' }).filter({ hasText: 'TC-18' });
    await row.getByRole('link').click();
    await reviewer.waitForURL(new RegExp(`/review/revisions/${revisionId}$`));
    // The author's reason is in the review, beside the diff.
    await reviewer.getByText('Tolerance on B+2 tightened after bench reports').waitFor();

    // The diff table names the reading and shows the tolerance before and after.
    const changes = reviewer.getByRole('table', { name: 'Value changes' });
    const tolerance = changes
      .getByRole('row')
      .filter({ hasText: 'Mains at the bench' })
      .filter({ hasText: 'tolerance' });
    await tolerance.waitFor();
    expect(await tolerance.innerText()).toMatch(/±10 %[\s\S]*±12 %/);
    // The values have room: neither figure wraps (the layout is fixed, not squeezed by long names).
    for (const figure of await tolerance.locator('.value').all())
      expect(await figure.evaluate((e) => e.getClientRects().length)).toBe(1);
    // The changed table can be scrolled from the keyboard: its box takes the focus and has a name.
    expect(await reviewer.getByRole('region', { name: 'Value changes' }).getAttribute('tabindex')).toBe('0');

    // The whole revision, rendered as the revision page renders it, beside the changes.
    const written = reviewer.getByRole('region', { name: /^Revision \d+ as written$/ });
    expect(await written.getAttribute('tabindex')).toBe('0');
    await written.locator('.readings-table').getByText('Mains at the bench').first().waitFor();
    await written.locator('[data-reckoner]').first().waitFor();
    const [changesBox, writtenBox] = [await changes.boundingBox(), await written.boundingBox()];
    expect(changesBox!.x + changesBox!.width).toBeLessThanOrEqual(writtenBox!.x + 1); // side by side

    // Text changes read as text changes: added words by colour and weight, removed ones struck through; no underline.
    const diff = reviewer.getByRole('region', { name: 'Text changes' });
    const added = diff.locator('ins').first();
    await added.waitFor();
    const style = (l: typeof added) =>
      l.evaluate((e) => {
        const s = getComputedStyle(e);
        return { line: s.textDecorationLine, weight: Number(s.fontWeight) };
      });
    expect(await style(added)).toEqual({ line: 'none', weight: 600 });
    expect((await style(diff.locator('del').first())).line).toBe('line-through');

    // Returning needs a comment: signing without one says so beside the field.
    await reviewer.getByRole('button', { name: 'Return with comments…' }).click();
    const returning = reviewer.getByRole('dialog');
    await returning.getByLabel('Your password').fill(demo.marek.password);
    await returning.getByRole('button', { name: 'Sign and return' }).click();
    await returning.getByRole('alert').filter({ hasText: 'say what needs to change' }).waitFor();
    await returning.getByRole('button', { name: 'Cancel' }).click();
    await returning.waitFor({ state: 'hidden' });

    // A wrong password is refused and nothing is signed.
    await reviewer.getByRole('button', { name: 'Approve…' }).click();
    const dialog = reviewer.getByRole('dialog');
    await dialog.getByLabel('Comment').fill('Wider mains tolerance matches the bench supply.');
    await dialog.getByLabel('Your password').fill('not-my-password');
    await dialog.getByRole('button', { name: 'Sign and approve' }).click();
    await dialog.getByRole('alert').filter({ hasText: 'password is not right' }).waitFor();

    await dialog.getByLabel('Your password').fill(demo.marek.password);
    await dialog.getByRole('button', { name: 'Sign and approve' }).click();
    const signed = reviewer.locator('[data-signature="approved"]');
    await signed.getByText('Approved by Marek Vos').waitFor();
    await signed.getByText('content verified').waitFor();
    expect(await signed.innerText()).toMatch(/\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);
    await reviewer.locator('[data-state="approved"]').waitFor();
    await reviewer.context().close();
  });

  it('the review pages run under the strict Content-Security-Policy with no violations', () => {
    expect(cspViolations).toEqual([]);
  });
});
