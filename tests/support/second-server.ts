import { spawn } from 'node:child_process';
import { projectRoot } from '../../server/bootstrap/prepare';

/**
 * A second app server: a separate Node process on the same database (tests/support/server-process.ts),
 * for tests of what several processes must share. Resolves with its URL once it listens.
 */
export async function startSecondServer(databaseUrl: string): Promise<{ url: string; stop: () => void }> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'tests/support/server-process.ts'], {
    cwd: projectRoot,
    env: { ...process.env, DATABASE_URL: databaseUrl },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('the second server did not start')), 30_000);
    child.stdout!.on('data', (chunk: Buffer) => {
      const m = /READY (\S+)/.exec(chunk.toString());
      if (m) {
        clearTimeout(timer);
        resolve(m[1]!);
      }
    });
  });
  return { url, stop: () => child.kill('SIGTERM') };
}
