/**
 * Client benchmark: builds the client with a manifest into dist/client-bench, prints the gzip size
 * of the JavaScript each main route loads (entry + the route's lazy chunk + their static imports),
 * then serves that build on a throwaway cluster and times, in headless Chromium, navigation to the
 * procedure reader's title heading: cold (new context, empty cache) and warm (a second visit in the
 * same context), on loopback and as a workshop tablet (CPU 4× slower, a 1.6 Mbit/s, 150 ms network).
 * Prints figures; it is not a timed test. Goals: reader and bench-run routes ≤ 200 kB gzip JS; the
 * editor only on editing routes; tablet reader cold < 1.5 s, warm < 0.5 s.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import type { BrowserContext, Page } from 'playwright-core';
import { build, type Rollup } from 'vite';
import { projectRoot, prepareDatabase, TEST_SLOT } from '../../server/bootstrap/prepare';
import { recreateDatabase, startCluster, stopCluster } from '../../server/bootstrap/postgres';
import { startServer } from '../../server/index';
import { createLogger } from '../../server/logger';
import { httpSession } from '../support/http-session';
import { launchBrowser } from '../support/browser';

const OUT_DIR = path.join(projectRoot, 'dist', 'client-bench');
const LOAD_RUNS = 7;
const KB = 1024;

// ── build ────────────────────────────────────────────────────────────────
const started = Date.now();
const output = (await build({
  logLevel: 'warn',
  configFile: path.join(projectRoot, 'vite.config.ts'),
  build: { outDir: OUT_DIR, emptyOutDir: true, manifest: true },
})) as Rollup.RollupOutput | Rollup.RollupOutput[];
console.log(`client built into dist/client-bench in ${((Date.now() - started) / 1000).toFixed(1)} s`);

type ManifestChunk = {
  file: string;
  src?: string;
  isEntry?: boolean;
  imports?: string[];
  dynamicImports?: string[];
};
const manifest = JSON.parse(readFileSync(path.join(OUT_DIR, '.vite', 'manifest.json'), 'utf8')) as Record<
  string,
  ManifestChunk
>;

// Chunks holding TipTap code, from the bundler's own module lists (minified code has no names).
const outputs = (Array.isArray(output) ? output : [output]).flatMap((o) => o.output);
const editorFiles = new Set(
  outputs
    .filter(
      (c): c is Rollup.OutputChunk =>
        c.type === 'chunk' && c.moduleIds.some((id) => id.includes('/node_modules/@tiptap/')),
    )
    .map((c) => c.fileName),
);

/** The files a manifest key loads: itself and its static imports, transitively. */
function staticClosure(key: string, into = new Set<string>()) {
  const chunk = manifest[key];
  if (!chunk) throw new Error(`not in the manifest: ${key}`);
  if (into.has(chunk.file)) return into;
  into.add(chunk.file);
  for (const k of chunk.imports ?? []) staticClosure(k, into);
  return into;
}
const gz = new Map<string, number>();
const gzipOf = (file: string) => {
  if (!gz.has(file)) gz.set(file, gzipSync(readFileSync(path.join(OUT_DIR, file)), { level: 9 }).length);
  return gz.get(file)!;
};

const entryKey = Object.keys(manifest).find((k) => manifest[k]!.isEntry)!;
const routes: [label: string, module: string, budgetKb?: number][] = [
  ['sign-in', 'app/routes/sign-in.tsx'],
  ['start (home)', 'app/routes/home.tsx'],
  ['procedure list', 'app/routes/procedures/list.tsx'],
  ['revision reader', 'app/routes/procedures/revision.tsx', 200],
  ['editor', 'app/routes/procedures/edit-revision.tsx'],
  ['bench-run checklist', 'app/routes/runs/run.tsx', 200],
  ['run sheet', 'app/routes/runs/run-sheet.tsx'],
  ['search', 'app/routes/search.tsx'],
];
const entryFiles = staticClosure(entryKey);
const entryKb = [...entryFiles].filter((f) => f.endsWith('.js')).reduce((a, f) => a + gzipOf(f), 0) / KB;
console.log(`\nJavaScript per route (gzip -9), entry ${entryKey} = ${entryKb.toFixed(1)} kB of it`);
console.log(`  ${'route'.padEnd(22)} ${'total'.padStart(9)} ${'route part'.padStart(11)}  editor?  goal`);
const failures: string[] = [];
for (const [label, module, budget] of routes) {
  const files = staticClosure(module, new Set(entryFiles));
  const js = [...files].filter((f) => f.endsWith('.js'));
  const total = js.reduce((a, f) => a + gzipOf(f), 0) / KB;
  const hasEditor = js.some((f) => editorFiles.has(f));
  const editingRoute = module.endsWith('edit-revision.tsx');
  const goals = [
    budget ? `≤ ${budget} kB ${total <= budget ? 'ok' : 'OVER'}` : '',
    hasEditor !== editingRoute ? (hasEditor ? 'editor loaded here: NOT OK' : 'editor missing?') : '',
  ].filter(Boolean);
  if (budget && total > budget) failures.push(`${label} ${total.toFixed(1)} kB > ${budget} kB`);
  if (hasEditor && !editingRoute) failures.push(`${label} loads the editor`);
  console.log(
    `  ${label.padEnd(22)} ${`${total.toFixed(1)} kB`.padStart(9)} ${`${(total - entryKb).toFixed(1)} kB`.padStart(11)}  ${(hasEditor ? 'yes' : 'no').padEnd(7)}  ${goals.join('; ')}`,
  );
}

// ── time to the reader's main content: cold and warm, loopback and a workshop tablet ──
// Inside this test slot's range of ports (BW_TEST_SLOT), so it never meets another slot's cluster.
const cluster = startCluster({ name: 'bench-client', port: 54356 + 20 * TEST_SLOT, projectRoot });
const server = await (async () => {
  await recreateDatabase(cluster.adminUrl, 'benchwright_bench_client');
  const url = await prepareDatabase(cluster, 'benchwright_bench_client');
  return startServer({
    databaseUrl: url,
    port: 0,
    logger: createLogger('warn'),
    config: { sessionSecret: 'bench-client'.padEnd(40, 'x'), clientDir: OUT_DIR },
  });
})();

/** A tablet on shop Wi-Fi: the CPU 4× slower, 1.6 Mbit/s down, 750 kbit/s up, 150 ms latency. */
async function throttle(page: Page) {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 });
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', {
    offline: false,
    latency: 150,
    downloadThroughput: 1_600_000 / 8,
    uploadThroughput: 750_000 / 8,
  });
}

type Timeline = { nav: number; entries: { name: string; start: number; end: number; bytes: number }[] };
const timelineOf = (page: Page): Promise<Timeline> =>
  page.evaluate(() => ({
    nav: (performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming).responseEnd,
    entries: (performance.getEntriesByType('resource') as PerformanceResourceTiming[]).map((e) => ({
      name: new URL(e.name).pathname,
      start: e.startTime,
      end: e.responseEnd,
      bytes: e.transferSize,
    })),
  }));

const browser = await launchBrowser();
try {
  const tech = httpSession(server.url);
  if ((await tech.signIn('tom@tallowcreek.example', 'tallow-bench-demo')).status !== 200)
    throw new Error('sign-in failed');
  const list = (await tech.get('/api/procedures')).body as {
    procedures: { approved: { id: string } | null }[];
  };
  const revisionId = list.procedures.find((p) => p.approved)!.approved!.id;
  const revision = (await tech.get(`/api/revisions/${revisionId}`)).body as { revision?: { title: string } };
  const title = revision.revision?.title;
  if (!title)
    throw new Error(`could not read the revision's title: ${JSON.stringify(revision).slice(0, 200)}`);
  const [name, value] = tech.cookieHeader().split('=') as [string, string];

  /** Opens the reader in a new tab of `context`; ms from the navigation's start to the title heading. */
  const visit = async (context: BrowserContext, slow: boolean) => {
    const page = await context.newPage();
    if (slow) await throttle(page);
    await page.goto(`${server.url}/revisions/${revisionId}`, { waitUntil: 'commit', timeout: 30_000 });
    // performance.now() counts from the navigation's start, so this is navigation → heading in the page.
    const at = await page.waitForFunction(
      (t) =>
        [...document.querySelectorAll('h1')].some((h) => h.textContent?.includes(t))
          ? performance.now()
          : false,
      title,
      { polling: 'raf', timeout: 30_000 },
    );
    const ms = (await at.jsonValue()) as number;
    await page.waitForLoadState('networkidle');
    const timeline = await timelineOf(page);
    await page.close();
    return { ms, timeline };
  };

  const results: Record<string, { cold: number[]; warm: number[]; last?: Timeline }> = {};
  for (const [label, slow] of [
    ['loopback', false],
    ['tablet', true],
  ] as const) {
    const r = (results[label] = { cold: [] as number[], warm: [] as number[] } as (typeof results)[string]);
    for (let i = 0; i < LOAD_RUNS; i++) {
      // Cold: a fresh context, so an empty HTTP cache and the session cookie only. Warm: a second tab
      // of the same context, so what the first visit cached.
      const context = await browser.newContext();
      await context.addCookies([{ name, value, url: server.url }]);
      const cold = await visit(context, slow);
      r.cold.push(cold.ms);
      r.warm.push((await visit(context, slow)).ms);
      r.last = cold.timeline;
      await context.close();
    }
  }

  // Where the time went, once: the last cold tablet visit's own resource timings.
  const last = results.tablet!.last!;
  console.log(
    `\nlast cold tablet visit (ms from navigation; bytes over the wire): document ${last.nav.toFixed(0)}`,
  );
  for (const e of last.entries)
    console.log(
      `  ${e.start.toFixed(0).padStart(5)} → ${e.end.toFixed(0).padStart(5)}  ${String(e.bytes).padStart(7)} B  ${e.name}`,
    );
  const fonts = last.entries.filter((e) => /\.woff2?$/.test(e.name));
  console.log(`  ${fonts.length} font files, ${(fonts.reduce((a, e) => a + e.bytes, 0) / KB).toFixed(1)} kB`);

  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
  const goals = { cold: 1500, warm: 500 };
  console.log(
    `\nProcedure reader, navigation → title heading visible, median of ${LOAD_RUNS} (Chromium headless)`,
  );
  console.log(`  ${''.padEnd(6)} ${'loopback'.padStart(10)} ${'tablet'.padStart(10)}  tablet goal`);
  for (const kind of ['cold', 'warm'] as const) {
    const fast = median(results.loopback![kind]);
    const slow = median(results.tablet![kind]);
    const ok = slow < goals[kind];
    if (!ok) failures.push(`tablet ${kind} median ${slow.toFixed(0)} ms ≥ ${goals[kind]} ms`);
    console.log(
      `  ${kind.padEnd(6)} ${`${fast.toFixed(0)} ms`.padStart(10)} ${`${slow.toFixed(0)} ms`.padStart(10)}  < ${goals[kind]} ms ${ok ? 'ok' : 'NOT MET'}`,
    );
  }
  for (const [label, r] of Object.entries(results))
    console.log(
      `  ${label} runs: cold ${r.cold.map((t) => t.toFixed(0)).join(', ')}; warm ${r.warm.map((t) => t.toFixed(0)).join(', ')} ms`,
    );
  console.log('  tablet: CPU 4× slower (CDP), 1.6 Mbit/s down, 750 kbit/s up, 150 ms latency');
} finally {
  await browser.close();
  await server.close();
  stopCluster(cluster.dataDir);
}
console.log(failures.length ? `\ngoals missed: ${failures.join('; ')}` : '\nall goals met');
