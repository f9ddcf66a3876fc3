/**
 * Client benchmark: builds the client with a manifest into dist/client-bench, prints the gzip size
 * of the JavaScript each main route loads (entry + the route's lazy chunk + their static imports),
 * then serves that build on a throwaway cluster and times, in headless Chromium with a cold cache,
 * navigation to the procedure reader's title heading. Prints figures; it is not a timed test.
 * Goals: reader and bench-run routes ≤ 200 kB gzip JS; the editor only on editing routes;
 * procedure page main content within 1 s.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { build, type Rollup } from 'vite';
import { projectRoot, prepareDatabase } from '../../server/bootstrap/prepare';
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

// ── time to the reader's main content, cold cache ─────────────────────────
const cluster = startCluster({ name: 'bench-client', port: 54497, projectRoot });
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

  const times: number[] = [];
  for (let i = 0; i < LOAD_RUNS; i++) {
    // A fresh context each time: empty HTTP cache, the session cookie only.
    const context = await browser.newContext();
    await context.addCookies([{ name, value, url: server.url }]);
    const page = await context.newPage();
    await page.goto(`${server.url}/revisions/${revisionId}`, { waitUntil: 'commit', timeout: 10_000 });
    // performance.now() counts from the navigation's start, so this is navigation → heading in the page.
    const at = await page.waitForFunction(
      (t) =>
        [...document.querySelectorAll('h1')].some((h) => h.textContent?.includes(t))
          ? performance.now()
          : false,
      title,
      { polling: 'raf', timeout: 10_000 },
    );
    times.push((await at.jsonValue()) as number);
    // Where the time went, once: the page's own resource timings (the chain html → JS → API).
    if (i === LOAD_RUNS - 1) {
      const entries = await page.evaluate(() =>
        performance.getEntriesByType('resource').map((e) => ({
          name: new URL(e.name).pathname,
          start: e.startTime,
          end: (e as PerformanceResourceTiming).responseEnd,
        })),
      );
      const nav = await page.evaluate(
        () => (performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming).responseEnd,
      );
      console.log(`
last run's timeline (ms from navigation): document ${nav.toFixed(0)}`);
      for (const e of entries.filter((x) => /\.js$|^\/api\//.test(x.name)))
        console.log(`  ${e.start.toFixed(0).padStart(5)} → ${e.end.toFixed(0).padStart(5)}  ${e.name}`);
    }
    await context.close();
  }
  const sorted = [...times].sort((a, b) => a - b);
  const median = sorted[Math.floor(sorted.length / 2)]!;
  console.log(
    `\nProcedure reader, cold cache, navigation → title heading visible (${LOAD_RUNS} runs, Chromium headless, loopback)`,
  );
  console.log(`  runs ${times.map((t) => t.toFixed(0)).join(', ')} ms`);
  console.log(
    `  median ${median.toFixed(0)} ms, max ${sorted.at(-1)!.toFixed(0)} ms (goal ≤ 1000 ms ${median <= 1000 ? 'ok' : 'OVER'})`,
  );
  if (median > 1000) failures.push(`reader median ${median.toFixed(0)} ms > 1000 ms`);
} finally {
  await browser.close();
  await server.close();
  stopCluster(cluster.dataDir);
}
console.log(failures.length ? `\ngoals missed: ${failures.join('; ')}` : '\nall goals met');
