import type { Browser, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, expect } from 'vitest';
import { launchBrowser } from './browser';
import { demo } from './test-app';
import { startTestServer } from './test-server';

/**
 * One browser test file's setup: the built app on a private database, Debian's Chromium, pages in
 * fresh contexts that record any Content-Security-Policy violation, and a sign-in through the form.
 * Every test is checked for violations on its own pages as it ends, so no test depends on another.
 */
export function useBrowserApp() {
  let server: Awaited<ReturnType<typeof startTestServer>> | undefined;
  let browser: Browser | undefined;
  const cspViolations: string[] = [];

  beforeAll(async () => {
    server = await startTestServer();
    browser = await launchBrowser();
  });
  afterEach(() => {
    const seen = cspViolations.splice(0);
    expect(seen, 'Content-Security-Policy violations during this test').toEqual([]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  const app = {
    get url() {
      return server!.url;
    },
    /** The test server's database, as the application role. */
    get databaseUrl() {
      return server!.databaseUrl;
    },
    /** Where the test server keeps uploaded bytes (a file store, server/storage/files.ts). */
    get uploadDir() {
      return server!.uploadDir;
    },
    get browser() {
      return browser!;
    },
    cspViolations,
    /** A page in a new context (no shared cookies). */
    async openPage(): Promise<Page> {
      const page = await (await browser!.newContext()).newPage();
      page.on('console', (m) => {
        if (/Content.Security.Policy/i.test(m.text())) cspViolations.push(m.text().slice(0, 200));
      });
      // The browser's own report, also for a violation the page catches (an eval probe in a try).
      await page.exposeFunction('__bwCspViolation', (text: string) => cspViolations.push(text));
      await page.addInitScript(() => {
        document.addEventListener('securitypolicyviolation', (e) => {
          (window as unknown as { __bwCspViolation: (t: string) => void }).__bwCspViolation(
            `${e.violatedDirective} ${e.blockedURI} at ${e.sourceFile}:${e.lineNumber}`,
          );
        });
      });
      return page;
    },
    /** Signs in through the sign-in form and waits until the app has left it. */
    async signIn(page: Page, who: keyof typeof demo) {
      await page.goto(server!.url + '/sign-in');
      await page.getByLabel('E-mail').fill(demo[who].email);
      await page.getByLabel('Password').fill(demo[who].password);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    },
  };
  return app;
}
