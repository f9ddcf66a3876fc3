/**
 * axe-core (WCAG 2.x A and AA rules) on every route, signed in as each role that can open it (one
 * browser context per person), including the editor and reader with every block kind and a bench run
 * in progress: no critical or serious violation.
 */
import { AxeBuilder } from '@axe-core/playwright';
import type { BrowserContext } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { routeTour, type Visit, type Visitor } from '../support/route-tour';

const app = useBrowserApp();
let tour: Visit[] = [];
beforeAll(async () => {
  tour = await routeTour(app.databaseUrl, app.uploadDir);
});

describe('accessibility of every page (axe-core)', () => {
  it('reports no critical or serious violation on any route', async () => {
    const contexts = new Map<Visitor, BrowserContext>();
    const found: string[] = [];
    try {
      for (const visit of tour) {
        let context = contexts.get(visit.who);
        if (!context) {
          context = await app.browser.newContext({ viewport: { width: 1366, height: 900 } });
          contexts.set(visit.who, context);
          const first = await context.newPage();
          if (visit.who !== 'anonymous') await app.signIn(first, visit.who);
        }
        const page = context.pages()[0]!;
        await page.goto(app.url + visit.url);
        await page.waitForLoadState('networkidle');
        await page.locator('h1').first().waitFor();
        const result = await new AxeBuilder({ page })
          .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice'])
          .analyze();
        for (const v of result.violations) {
          if (v.impact !== 'critical' && v.impact !== 'serious') continue;
          const where = v.nodes
            .slice(0, 3)
            .map((n) => n.target.join(' '))
            .join(' | ');
          found.push(
            `${visit.route}${visit.what ? ` (${visit.what})` : ''} as ${visit.who}: ${v.id} (${v.impact}, ${v.nodes.length}×) ${where}`,
          );
        }
      }
    } finally {
      for (const c of contexts.values()) await c.close();
    }
    expect(found.join('\n')).toBe('');
  }, 1_200_000);
});
