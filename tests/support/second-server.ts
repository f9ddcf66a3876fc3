import { spawn, type ChildProcess } from 'node:child_process';
import { projectRoot } from '../../server/bootstrap/prepare';
import type { AppConfig } from '../../server/deps';

export interface ServerProcess {
  url: string;
  child: ChildProcess;
  /** Resolves when the process has exited. */
  exited: Promise<void>;
  stop: () => void;
}

/**
 * Another app server: a separate Node process on the same database (tests/support/server-process.ts),
 * for tests of what several processes must share. Resolves with its URL once it listens.
 */
export async function startSecondServer(
  databaseUrl: string,
  opts: { port?: number; config?: Partial<AppConfig> } = {},
): Promise<ServerProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'tests/support/server-process.ts'], {
    cwd: projectRoot,
    env: {
      ...process.env,
      DATABASE_URL: databaseUrl,
      BW_TEST_PORT: String(opts.port ?? 0),
      BW_TEST_CONFIG: JSON.stringify(opts.config ?? {}),
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('the server process did not start')), 30_000);
    child.once('exit', (code) => reject(new Error(`the server process exited early with ${code}`)));
    child.stdout!.on('data', (chunk: Buffer) => {
      const m = /READY (\S+)/.exec(chunk.toString());
      if (m) {
        clearTimeout(timer);
        resolve(m[1]!);
      }
    });
  });
  return { url, child, exited, stop: () => child.kill('SIGTERM') };
}
