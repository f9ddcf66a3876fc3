// Hostile strings stored through the API in procedure bodies, titles, review comments, unit names
// and upload file names, then rendered in Chromium: no script may run.
// Corpora: big-list-of-naughty-strings (Max Woolf and contributors, MIT licence), its script-injection
// entries, each rewritten to call a tripwire instead of alert so a run is detectable even without a
// dialog, plus the same strings untouched; and filter-evasion vectors after the OWASP XSS Filter
// Evasion Cheat Sheet (tests/support/xss-evasion.ts, written from memory; they trip the wire too).
import { createRequire } from 'node:module';
import { beforeAll, describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { httpSession } from '../support/http-session';
import { tinyPng } from '../support/png';
import { demo } from '../support/test-app';
import { EVASION_VECTORS } from '../support/xss-evasion';

const blns = createRequire(import.meta.url)('big-list-of-naughty-strings/blns.json') as string[];
const hostile = blns.filter((s) => /<|javascript:|on\w+=/i.test(s));
const tripwired = [
  ...hostile.map((s) => s.replace(/alert\s*\(\s*[^)]*\)/gi, 'window.__bwTripped=1')),
  ...EVASION_VECTORS,
];

const app = useBrowserApp();
const pages: string[] = [];

beforeAll(async () => {
  const hal = httpSession(app.url);
  expect((await hal.signIn(demo.hal.email, demo.hal.password)).status).toBe(200);
  const meta = {
    title: `Hostile ${tripwired[0]!.slice(0, 120)}`,
    equipmentFamily: `<img src=x onerror=window.__bwTripped=1>`,
    equipmentModel: 'TC-18',
    tags: ['<svg onload=window.__bwTripped=1>'],
  };
  const created = await hal.post('/api/procedures', meta);
  expect(created.status).toBe(201);
  const rev = created.body.revision as { id: string; procedureId: string };
  const content = [...hostile, ...tripwired].flatMap((s, i) => [
    { type: 'paragraph', content: [{ type: 'text', text: s }] },
    { type: 'checkStep', attrs: { id: `xss-check-${i}`, text: s.slice(0, 500) } },
  ]);
  const saved = await hal.call('PUT', `/api/revisions/${rev.id}`, {
    ...meta,
    params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
    lockVersion: 1,
    document: { type: 'doc', content },
  });
  expect(saved.status).toBe(200);
  const comment = await hal.post(`/api/revisions/${rev.id}/comments`, {
    body: tripwired.slice(0, 20).join('\n').slice(0, 1900),
  });
  expect(comment.status).toBe(201);

  const tom = httpSession(app.url);
  expect((await tom.signIn(demo.tom.email, demo.tom.password)).status).toBe(200);
  const unit = await tom.post('/api/units', {
    model: '<script>window.__bwTripped=1</script>',
    serial: '"><img src=x onerror=window.__bwTripped=1>',
    owner: tripwired[1]!.slice(0, 100),
    notes: tripwired.slice(0, 10).join('\n'),
  });
  expect(unit.status).toBe(201);
  const unitId = (unit.body.unit as { id: string }).id;

  // An upload whose file name is hostile: the name is shown back on the unit page.
  const form = new FormData();
  form.append(
    'file',
    new Blob([tinyPng()], { type: 'image/png' }),
    '<img src=x onerror=window.__bwTripped=1>.png',
  );
  form.append('caption', '<svg/onload=window.__bwTripped=1>');
  const photo = await fetch(`${app.url}/api/units/${unitId}/photos`, {
    method: 'POST',
    headers: { cookie: tom.cookieHeader(), 'x-csrf-token': tom.csrfToken() },
    body: form,
  });
  expect(photo.status).toBe(201);

  pages.push(
    `/revisions/${rev.id}`,
    `/review/revisions/${rev.id}`,
    '/procedures',
    `/units/${unitId}`,
    '/units',
  );
});

describe('stored hostile strings rendered in Chromium', () => {
  it('no script runs on the reader, review, list and unit pages', async () => {
    const context = await app.browser.newContext();
    const page = await context.newPage();
    const dialogs: string[] = [];
    // The CSP would stop an injected handler from running; a violation report means one got into the DOM.
    const violations: string[] = [];
    page.on('console', (m) => {
      if (/Content.Security.Policy/i.test(m.text())) violations.push(m.text().slice(0, 160));
    });
    page.on('dialog', (d) => {
      dialogs.push(d.message());
      void d.dismiss();
    });
    await page.goto(app.url + '/sign-in');
    await page.getByLabel('E-mail').fill(demo.hal.email);
    await page.getByLabel('Password').fill(demo.hal.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    for (const path of pages) {
      await page.goto(app.url + path);
      await page.waitForLoadState('networkidle');
      await page.waitForTimeout(300);
      const tripped = await page.evaluate(
        () => (window as unknown as { __bwTripped?: number }).__bwTripped ?? 0,
      );
      expect(tripped, `script ran on ${path}`).toBe(0);
      // Independently of the CSP: nothing from the payloads became markup.
      const injected = await page.evaluate(() => {
        const found: string[] = [];
        for (const el of Array.from(document.querySelectorAll('body *'))) {
          for (const a of Array.from(el.attributes))
            if (/^on/i.test(a.name)) found.push(`${el.tagName} ${a.name}`);
          if (el.tagName === 'SCRIPT' || el.tagName === 'IFRAME' || el.tagName === 'OBJECT')
            found.push(el.tagName);
          if (el.tagName === 'IMG' && (el as HTMLImageElement).getAttribute('src') === 'x')
            found.push('IMG src=x');
          const href = el.getAttribute('href') ?? el.getAttribute('src') ?? '';
          if (/^\s*(javascript|vbscript|data:text)/i.test(href))
            found.push(`${el.tagName} ${href.slice(0, 30)}`);
        }
        return found;
      });
      expect(injected, `markup injected on ${path}`).toEqual([]);
      // The hostile text is on the page as text.
      if (path.startsWith('/revisions/')) expect(await page.content()).toContain('&lt;script');
    }
    expect(dialogs).toEqual([]);
    expect(violations).toEqual([]);
    await context.close();
  });
});
