// The author carries on from a returned revision; a technician reads what changed before running
// a newly approved revision.
import { and, eq } from 'drizzle-orm';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { createDb, createPool } from '../../server/db/client';
import { revisions, units } from '../../server/db/schema';
import { paths } from '../../shared/paths';
import { useBrowserApp } from '../support/e2e';
import { procedureInState, textDoc } from '../support/review-path';
import { demo } from '../support/test-app';

const app = useBrowserApp();

async function signIn(page: Page, who: keyof typeof demo) {
  await app.signIn(page, who);
  await page.getByRole('button', { name: 'Sign out' }).waitFor();
}

async function withDb<T>(work: (db: ReturnType<typeof createDb>) => Promise<T>) {
  const pool = createPool(app.databaseUrl);
  try {
    return await work(createDb(pool));
  } finally {
    await pool.end();
  }
}

describe('the quality loop in Chromium', () => {
  it('a returned revision is carried on by its author: a new draft from it, submitted with a reason', async () => {
    const returnedText = 'Let the reservoir settle for a minute before the first reading.';
    const { procedure, revision } = await withDb((db) =>
      procedureInState(db, 'returned', {
        title: 'TC-5R dial lamp and rectifier check',
        equipmentFamily: 'Table radio',
        equipmentModel: 'TC-5R',
        tags: [],
        document: textDoc(returnedText),
      }),
    );
    const page = await app.openPage();
    await signIn(page, 'hal');
    // The procedure page offers it beside the returned revision …
    await page.goto(app.url + paths.procedure.href(procedure.id));
    await page.getByRole('button', { name: 'Start a new draft from this (revision 1)' }).waitFor();
    // … and so does the revision page.
    await page.goto(app.url + paths.revision.href(revision.id));
    await page.getByText('This revision is returned').waitFor();
    await page.getByRole('button', { name: 'Start a new draft from this (revision 1)' }).click();
    await page.waitForURL(/\/revisions\/[0-9a-f-]{36}\/edit$/);
    const draftId = page.url().split('/').at(-2)!;
    expect(draftId).not.toBe(revision.id);
    await page.getByText(returnedText).first().waitFor();

    // Submitted from the draft's page, with the reason the history then shows.
    await page.goto(app.url + paths.revision.href(draftId));
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText('Change reason is required').waitFor();
    await page.getByLabel('Change reason').fill('Settling time added, as the reviewer asked');
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText('Submitted. The reviewers have been told').waitFor();
    await page.goto(app.url + paths.procedure.href(procedure.id));
    await page.getByText('Change reason: Settling time added, as the reviewer asked').waitFor();
    await page.context().close();
  });

  it('a technician who ran the previous revision reads what changed and acknowledges it before the run', async () => {
    const { r2, unitId } = await withDb(async (db) => {
      const [r] = await db
        .select()
        .from(revisions)
        .where(
          and(
            eq(revisions.title, 'TC-30H: bleeder resistor retrofit across the reservoir'),
            eq(revisions.number, 2),
          ),
        );
      const [u] = await db.select().from(units).where(eq(units.serial, 'TC30H-0088'));
      return { r2: r!, unitId: u!.id };
    });
    const page = await app.openPage();
    await signIn(page, 'priya');

    // The revision page says so before she tries.
    await page.goto(app.url + paths.revision.href(r2.id));
    await page.getByText('changed the procedure you ran before').waitFor();

    // Starting the run anyway is refused, with the reason and the way to acknowledge.
    await page.goto(app.url + paths.newRun.href(unitId, r2.id));
    await page.getByLabel('Measured mains (V)').fill('121 V');
    await page.getByLabel('Mains frequency (Hz)').fill('60');
    await page.getByRole('button', { name: 'Start the bench run' }).click();
    await page.getByText(/read what changed and acknowledge it before your first run on it/).waitFor();
    await page.getByRole('link', { name: 'Read what changed and acknowledge it' }).click();
    await page.waitForURL(new RegExp(`/revisions/${r2.id}/acknowledge$`));

    // What changed, in words and numbers: the reason and the reading's tolerance before and after.
    await page.getByText(r2.changeReason).waitFor();
    const changes = page.getByRole('table', { name: 'Value changes' });
    const row = changes.getByRole('row').filter({ hasText: 'tolerance' });
    await row.filter({ hasText: '±25 %' }).filter({ hasText: '±15 %' }).waitFor();
    await page.getByText(r2.contentHash!).waitFor();
    await page.getByRole('button', { name: 'I have read what changed' }).click();
    await page.getByText(/You acknowledged revision 2 on/).waitFor();

    await page.getByRole('link', { name: 'Start a bench run on it' }).click();
    await page.getByLabel('Unit on the bench').selectOption(unitId);
    await page.getByLabel('Measured mains (V)').fill('121 V');
    await page.getByLabel('Mains frequency (Hz)').fill('60');
    await page.getByRole('button', { name: 'Start the bench run' }).click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    await page.context().close();

    // The reviewer sees who has read it.
    const reviewer = await app.openPage();
    await signIn(reviewer, 'marek');
    await reviewer.goto(app.url + paths.revision.href(r2.id));
    const panel = reviewer.getByRole('region', { name: 'Acknowledgements' });
    await panel.getByText('Priya Lindqvist').waitFor();
    await panel.getByText(/acknowledged \d{4}-\d{2}-\d{2}/).waitFor();
    await reviewer.context().close();
  });
});
