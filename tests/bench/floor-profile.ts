// Where the signed-in floor's time goes: the app (demo data) in its own process under
// --cpu-prof, loaded with GET /api/auth/session (headers, request log, session, person, CSRF and
// nothing else) for BENCH_SECONDS, then the profile summed by package and project function
// (profile-summary.ts). Beside it, the same load on the bare Express endpoint.
import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { projectRoot, prepareDatabase, TEST_SLOT } from '../../server/bootstrap/prepare';
import { recreateDatabase, startCluster, stopCluster } from '../../server/bootstrap/postgres';
import { httpSession } from '../support/http-session';
import { cpuSeconds } from './process-cpu';

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const cluster = startCluster({ name: 'bench-api', port: 54356 + 20 * TEST_SLOT, projectRoot });
await recreateDatabase(cluster.adminUrl, 'benchwright_bench_floor');
const url = await prepareDatabase(cluster, 'benchwright_bench_floor');
const profileDir = mkdtempSync(path.join(tmpdir(), 'bw-floor-'));

function start(script: string, env: Record<string, string>, args: string[] = []) {
  const child = spawn(process.execPath, [...args, '--import', 'tsx', script], {
    cwd: projectRoot,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  return new Promise<{ child: typeof child; url: string }>((resolve) => {
    let out = '';
    child.stdout.on('data', (c: Buffer) => {
      if (out.length < 65_536) out += c.toString();
      const m = /READY (\S+)/.exec(out);
      if (m) resolve({ child, url: m[1]! });
    });
  });
}
const app = await start(
  'tests/support/server-process.ts',
  { DATABASE_URL: url, LOG_LEVEL: process.env.LOG_LEVEL ?? 'info' },
  ['--cpu-prof', `--cpu-prof-dir=${profileDir}`],
);
const bare = await start('tests/bench/bare-server.ts', {});
const tom = httpSession(app.url);
await tom.signIn('tom@tallowcreek.example', 'tallow-bench-demo');

async function run(label: string, target: string, pid: number, headers: Record<string, string> = {}) {
  const cpu0 = cpuSeconds(pid);
  const r = await autocannon({ url: target, connections: 10, duration: SECONDS, headers });
  const ms = ((cpuSeconds(pid) - cpu0) * 1000) / r.requests.total;
  console.log(
    `${label.padEnd(26)} ${r.requests.average.toFixed(0).padStart(6)} req/s   p50 ${r.latency.p50} ms   p99 ${r.latency.p99} ms   CPU ${ms.toFixed(3)} ms/request   non-2xx ${r.non2xx}`,
  );
}
await run('signed-in floor (session)', `${app.url}/api/auth/session`, app.child.pid!, {
  cookie: tom.cookieHeader(),
});
await run('bare Express fixed JSON', `${bare.url}/fixed`, bare.child.pid!);

const stopped = (c: typeof app.child) => new Promise((r) => c.once('exit', r).kill('SIGTERM'));
await Promise.all([stopped(app.child), stopped(bare.child)]);
stopCluster(cluster.dataDir);
const file = path.join(
  profileDir,
  readdirSync(profileDir).find((f) => f.endsWith('.cpuprofile'))!,
);
spawn(process.execPath, ['--import', 'tsx', 'tests/bench/profile-summary.ts', file, '30'], {
  cwd: projectRoot,
  stdio: 'inherit',
});
