/**
 * No page of the app trips its own Content-Security-Policy — not even a probe the page catches,
 * such as a library testing whether it may compile code with eval.
 */
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';

const app = useBrowserApp();

describe('Content-Security-Policy', () => {
  it('signing in and opening the main pages as an author, a reviewer, a technician and an admin reports no violation', async () => {
    const visits: Record<string, string[]> = {
      hal: ['/', '/procedures', '/search?q=hum'],
      marek: ['/review'],
      tom: ['/runs', '/units'],
      admin: ['/admin/people', '/admin/audit'],
    };
    for (const [who, paths] of Object.entries(visits)) {
      const page = await app.openPage();
      await page.goto(app.url + '/sign-in');
      await page.waitForLoadState('networkidle');
      await app.signIn(page, who as 'hal');
      for (const p of paths) {
        await page.goto(app.url + p);
        await page.waitForLoadState('networkidle');
      }
      // An editor and a reader page too.
      if (who === 'hal') {
        await page.goto(app.url + '/procedures');
        await page.getByRole('link', { name: /TC-18/ }).first().click();
        await page.waitForLoadState('networkidle');
      }
      await page.context().close();
    }
    expect(app.cspViolations).toEqual([]);
  });
});
