// `npm test`: a throwaway cluster and template database (never npm start's), a client build for the
// browser tests, then vitest over unit, API and end-to-end projects. Exits with vitest's code.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { build } from 'vite';
import { projectRoot, say, testClientDir } from './prepare';
import { stopCluster } from './postgres';
import { prepareTestTemplate } from '../../tests/support/test-cluster';

const STATIC_CHECKS: [string, string[]][] = [
  ['lint (ESLint)', ['eslint', '.']],
  ['format check (Prettier)', ['prettier', '--check', '--log-level', 'warn', '.']],
  ['type check (tsc)', ['tsc', '--noEmit', '-p', '.']],
];

const args = process.argv.slice(2);

// A full run starts with the static checks (lint, format, types); a run narrowed to some files or
// projects skips them.
if (args.length === 0) {
  for (const [what, command] of STATIC_CHECKS) {
    say(`${what}…`);
    const check = spawnSync(path.join(projectRoot, 'node_modules/.bin', command[0]!), command.slice(1), {
      cwd: projectRoot,
      stdio: 'inherit',
    });
    if (check.status !== 0) {
      say(`${what} found problems; fix them (npm run lint:fix formats and fixes what it can).`);
      process.exit(check.status ?? 1);
    }
  }
}

const { cluster } = await prepareTestTemplate();

// The browser tests need a client build; a run limited to other projects skips it.
const projects = args.flatMap((a, i) =>
  a === '--project' ? [args[i + 1]] : a.startsWith('--project=') ? [a.slice(10)] : [],
);
const needsBuild = projects.length === 0 || projects.includes('e2e');
if (needsBuild) say('building the client for the browser tests…');
if (needsBuild)
  await build({
    logLevel: 'warn',
    configFile: path.join(projectRoot, 'vite.config.ts'),
    build: { outDir: testClientDir },
  });

const vitest = spawnSync(
  path.join(projectRoot, 'node_modules/.bin/vitest'),
  ['run', ...process.argv.slice(2)],
  {
    cwd: projectRoot,
    stdio: 'inherit',
    env: { ...process.env, BW_TEST_PREPARED: '1' },
  },
);

stopCluster(cluster.dataDir);
process.exit(vitest.status ?? 1);
