import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import type { Page, Request } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { testClientDir } from '../../server/bootstrap/prepare';
import { useBrowserApp } from '../support/e2e';
import { httpSession } from '../support/http-session';
import { demo } from '../support/test-app';

/**
 * What a workshop tablet downloads for the procedure reader, cold: compressed scripts kept for a
 * year, only the font subsets the app declares (src/fonts.css) with the two above the fold
 * preloaded by index.html, and the revision asked for while the session answer is still on its way.
 */
const app = useBrowserApp();

/** The faces the app declares, in its three subsets: fontsource's file names, hashed by the build. */
const SUBSET_FONT =
  /^\/assets\/(literata-(latin|greek)-(400-normal|400-italic|600-normal)|jetbrains-mono-(latin|greek)-(400|600)-normal)-[\w-]+\.woff2$/;
const PRELOADED = ['literata-latin-400-normal', 'literata-latin-600-normal'];

/** A cold tab (new context, empty cache) signed in as Tom, and an approved revision to read. */
async function coldReader() {
  const tech = httpSession(app.url);
  expect((await tech.signIn(demo.tom.email, demo.tom.password)).status).toBe(200);
  const list = (await tech.get('/api/procedures')).body as {
    procedures: { approved: { id: string } | null }[];
  };
  const revisionId = list.procedures.find((p) => p.approved)!.approved!.id;
  const { revision } = (await tech.get(`/api/revisions/${revisionId}`)).body as {
    revision: { title: string };
  };
  const page = await app.openPage();
  const [name, value] = tech.cookieHeader().split('=') as [string, string];
  await page.context().addCookies([{ name, value, url: app.url }]);
  return { page, url: `${app.url}/revisions/${revisionId}`, title: revision.title };
}

const pathOf = (r: Request) => new URL(r.url()).pathname;
const requestsOf = (page: Page) => {
  const seen: Request[] = [];
  page.on('request', (r) => seen.push(r));
  return seen;
};

describe('the reader on a cold tablet', () => {
  it('loads compressed, year-cached scripts and only the declared font subsets, the two above the fold preloaded once each', async () => {
    // The build ships woff2 files of the declared faces and subsets only (not every subset fontsource has).
    const built = readdirSync(path.join(testClientDir, 'assets')).filter((f) => f.endsWith('.woff2'));
    expect(built.filter((f) => !SUBSET_FONT.test(`/assets/${f}`))).toEqual([]);
    expect(built).toHaveLength(10);
    const html = readFileSync(path.join(testClientDir, 'index.html'), 'utf8');
    for (const font of PRELOADED)
      expect(html).toMatch(
        new RegExp(`<link rel="preload" href="/assets/${font}-[\\w-]+\\.woff2" as="font"`),
      );

    const { page, url, title } = await coldReader();
    const requests = requestsOf(page);
    await page.goto(url);
    await page.getByRole('heading', { level: 1, name: title }).waitFor();
    await page.waitForLoadState('networkidle');

    const scripts = requests.filter((r) => r.resourceType() === 'script');
    expect(scripts.length).toBeGreaterThan(1);
    for (const s of scripts) {
      const headers = (await s.response())!.headers();
      expect(headers['content-encoding'], pathOf(s)).toMatch(/^(br|gzip)$/);
      expect(headers['cache-control'], pathOf(s)).toBe('public, max-age=31536000, immutable');
    }
    const revision = requests.find((r) => /^\/api\/revisions\/[\w-]+$/.test(pathOf(r)))!;
    expect((await revision.response())!.headers()['content-encoding']).toMatch(/^(br|gzip)$/);

    const fonts = requests.filter((r) => r.resourceType() === 'font').map(pathOf);
    console.log(`fonts fetched for the reader: ${fonts.length} (${fonts.join(', ')})`);
    expect(fonts.filter((f) => !SUBSET_FONT.test(f))).toEqual([]);
    // Each once: a preload the stylesheet's font-face did not match would be fetched a second time.
    expect(new Set(fonts).size).toBe(fonts.length);
    for (const font of PRELOADED) expect(fonts.filter((f) => f.includes(`/${font}-`))).toHaveLength(1);
    // Body, headings and values in latin, Ω in greek: never more than the build holds (once 33 files).
    expect(fonts.length).toBeGreaterThanOrEqual(4);
    expect(fonts.length).toBeLessThanOrEqual(built.length);
  });

  it('asks for the revision once, with the reader’s code, while the session answer is still on its way', async () => {
    const { page, url, title } = await coldReader();
    let sessionReleased = 0; // when the held-back session request went on to the server
    // The session answer held back 800 ms: a page that waited for it would ask for its data after.
    await page.route('**/api/auth/session', async (route) => {
      await new Promise((r) => setTimeout(r, 800));
      await route.continue();
      sessionReleased = Date.now();
    });
    const asked: { path: string; type: string; at: number }[] = [];
    page.on('request', (r) => asked.push({ path: pathOf(r), type: r.resourceType(), at: Date.now() }));
    await page.goto(url);
    await page.getByRole('heading', { level: 1, name: title }).waitFor();
    await page.waitForLoadState('networkidle');
    expect(sessionReleased).toBeGreaterThan(0);

    const revision = asked.filter((r) => /^\/api\/revisions\/[\w-]+$/.test(r.path));
    // Once: the page mounting after the session answer takes the loader's answer, not a second one.
    expect(revision).toHaveLength(1);
    expect(revision[0]!.at).toBeLessThan(sessionReleased - 400);
    // The reader's chunk alongside (named after the route module, revision.tsx, with an 8-character hash).
    const chunk = asked.find((r) => r.type === 'script' && /^\/assets\/revision-[\w-]{8}\.js$/.test(r.path));
    expect(chunk, asked.map((r) => r.path).join(' ')).toBeDefined();
    expect(chunk!.at).toBeLessThan(sessionReleased - 400);
  });
});
