/**
 * Every route at a phone, tablet, small laptop and desktop width: the document is never wider than
 * the window (long results wrap or truncate). At 1366 and 390 px each page is also saved as a
 * screenshot in .data/screens/ (git-ignored) — `npm run screenshots` runs only this file.
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectRoot } from '../../server/bootstrap/prepare';
import { useBrowserApp } from '../support/e2e';
import { onePerAddress, routeTour, type Visit, type Visitor } from '../support/route-tour';

const app = useBrowserApp();
const WIDTHS = [390, 768, 1024, 1366] as const;
const HEIGHT: Record<(typeof WIDTHS)[number], number> = { 390: 844, 768: 1024, 1024: 768, 1366: 900 };
const SCREENS = path.join(projectRoot, '.data', 'screens');

let tour: Visit[] = [];
beforeAll(async () => {
  tour = onePerAddress(await routeTour(app.databaseUrl, app.uploadDir));
});
afterAll(() => {
  console.log(`[layout] screenshots of every route at 1366 and 390 px: ${SCREENS}`);
});

/** What sticks out past the right edge: a few elements, named so a person can find them. */
function overflowAt(page: Page) {
  return page.evaluate(() => {
    const width = document.documentElement.clientWidth;
    const wide = document.documentElement.scrollWidth;
    const culprits: string[] = [];
    // Content inside a scrolling or clipping box does not widen the page.
    const clipped = (el: HTMLElement) => {
      for (let a = el.parentElement; a && a !== document.body; a = a.parentElement) {
        if (getComputedStyle(a).overflowX !== 'visible') return true;
      }
      return false;
    };
    if (wide > width + 1) {
      for (const el of Array.from(document.body.querySelectorAll<HTMLElement>('*'))) {
        const r = el.getBoundingClientRect();
        // Text that runs out of its box widens the page as much as a box does.
        const spills = getComputedStyle(el).overflowX === 'visible' && r.left + el.scrollWidth > width + 1;
        if ((r.right > width + 1 || spills) && r.width > 0 && !clipped(el)) {
          // The innermost offender of each branch: the content that does not fit.
          // (A scroll box that is itself too wide counts as one piece.)
          const scrolls = getComputedStyle(el).overflowX !== 'visible';
          const child = Array.from(el.children).some((c) => {
            const cr = c.getBoundingClientRect();
            return cr.right > width + 1 || cr.left + c.scrollWidth > width + 1;
          });
          if (child && !scrolls) continue;
          const text = (el.innerText || '').trim().slice(0, 40);
          culprits.push(`${el.tagName.toLowerCase()}.${el.className.toString().slice(0, 60)} “${text}”`);
          if (culprits.length >= 6) break;
        }
      }
    }
    return { width, wide, culprits };
  });
}

describe('no page is wider than the window', () => {
  for (const width of WIDTHS) {
    it(`at ${width} px`, async () => {
      const contexts = new Map<Visitor, BrowserContext>();
      const pageFor = async (who: Visitor) => {
        let context = contexts.get(who);
        if (!context) {
          context = await app.browser.newContext({ viewport: { width, height: HEIGHT[width] } });
          contexts.set(who, context);
          const page = await context.newPage();
          if (who !== 'anonymous') await app.signIn(page, who);
          return page;
        }
        return context.pages()[0]!;
      };
      const shots = path.join(SCREENS, String(width));
      if (width === 390 || width === 1366) mkdirSync(shots, { recursive: true });
      try {
        for (const visit of tour) {
          const page = await pageFor(visit.who);
          await page.goto(app.url + visit.url);
          await page.waitForLoadState('networkidle');
          await page.locator('h1').first().waitFor();
          const { wide, culprits } = await overflowAt(page);
          expect
            .soft(
              wide,
              `${visit.route}${visit.what ? ` (${visit.what})` : ''} as ${visit.who} at ${width} px: ${culprits.join('; ')}`,
            )
            .toBeLessThanOrEqual(width + 1);
          if (width === 390 || width === 1366) {
            await page.screenshot({
              path: path.join(shots, `${visit.route}${visit.what ? `-${visit.what}` : ''}-${visit.who}.png`),
              fullPage: true,
            });
          }
        }
      } finally {
        for (const c of contexts.values()) await c.close();
      }
    }, 300_000);
  }
});

describe('a bench run on a phone', () => {
  it('shows the first step without scrolling at 390 × 844, the menu folded away', async () => {
    const visit = tour.find((v) => v.route === 'run')!;
    const context = await app.browser.newContext({ viewport: { width: 390, height: 844 } });
    try {
      const page = await context.newPage();
      await app.signIn(page, visit.who as 'tom');
      await page.goto(app.url + visit.url);
      const first = page.locator('article[data-step-id]').first();
      await first.waitFor();
      const box = await first.boundingBox();
      expect(box!.y, 'top of the first step (px from the top of the window)').toBeLessThan(844 - 120);
      expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
      // The menu opens on demand and its links work.
      await page.getByRole('button', { name: 'Menu' }).click();
      await page.getByRole('link', { name: 'Units', exact: true }).click();
      await page.getByRole('heading', { name: 'Units' }).waitFor();
    } finally {
      await context.close();
    }
  }, 60_000);
});
