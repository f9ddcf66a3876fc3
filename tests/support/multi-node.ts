// Several app processes behind Debian's nginx (round-robin), on one database and one upload store:
// the nginx runs in the foreground from a generated configuration in a temporary folder (its pid,
// logs and buffers there too), on a loopback port inside this test slot's range.
import { spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { PORTS } from '../../server/bootstrap/prepare';
import type { AppConfig } from '../../server/deps';
import { startSecondServer, type ServerProcess } from './second-server';

export const NGINX = '/usr/sbin/nginx';

/** The slot's ports for the app processes and nginx (server/bootstrap/prepare.ts keeps the slot's port plan). */
const appPort = (i: number) => PORTS.multiNodeApps + i;
const proxyPort = PORTS.multiNodeProxy;

/** The sample configuration of the README, on loopback, for `ports` behind one `listen` port. */
export function nginxConfig(opts: { listen: number; upstreams: number[]; dir: string }) {
  const temp = (name: string) => `${name}_temp_path ${path.join(opts.dir, name)};`;
  return `daemon off;
worker_processes 1;
pid ${path.join(opts.dir, 'nginx.pid')};
error_log ${path.join(opts.dir, 'error.log')} warn;
events { worker_connections 512; }
http {
  access_log off;
  ${['client_body', 'proxy', 'fastcgi', 'uwsgi', 'scgi'].map(temp).join('\n  ')}
  upstream benchwright {
    ${opts.upstreams.map((p) => `server 127.0.0.1:${p} max_fails=1 fail_timeout=5s;`).join('\n    ')}
    keepalive 16;
  }
  server {
    listen 127.0.0.1:${opts.listen};
    client_max_body_size 16m;
    location / {
      proxy_pass http://benchwright;
      proxy_http_version 1.1;
      proxy_set_header Connection "";
      proxy_set_header Host $http_host;
      proxy_set_header X-Forwarded-For $proxy_add_x_forwarded_for;
      proxy_set_header X-Forwarded-Proto $scheme;
      # A process that is gone: try the next one (PUT is idempotent; POST is never sent twice).
      proxy_next_upstream error timeout http_502;
      proxy_connect_timeout 2s;
    }
  }
}
`;
}

export interface MultiNode {
  /** nginx's address: what people reach. */
  url: string;
  /** Each app process, reached directly. */
  nodes: ServerProcess[];
  uploadDir: string;
  /** What nginx logged (warnings and errors: e.g. an app process that went away). */
  errorLog(): string;
  stop(): Promise<void>;
}

/** Starts `count` app processes on the database and nginx in front of them; stop() ends them all. */
export async function startMultiNode(
  databaseUrl: string,
  count = 3,
  config: Partial<AppConfig> = {},
): Promise<MultiNode> {
  const dir = mkdtempSync(path.join(tmpdir(), 'bw-nginx-'));
  chmodSync(dir, 0o755); // nginx's workers (user nobody under root) use the buffers in here
  const uploadDir = mkdtempSync(path.join(tmpdir(), 'bw-shared-uploads-'));
  const url = `http://127.0.0.1:${proxyPort}`;
  const shared: Partial<AppConfig> = {
    publicUrl: url,
    uploadDir,
    trustProxy: 'loopback',
    ...config,
  };
  const nodes = await Promise.all(
    Array.from({ length: count }, (_, i) =>
      startSecondServer(databaseUrl, { port: appPort(i), config: shared }),
    ),
  );
  const conf = path.join(dir, 'nginx.conf');
  writeFileSync(conf, nginxConfig({ listen: proxyPort, upstreams: nodes.map((_, i) => appPort(i)), dir }));
  const nginx: ChildProcess = spawn(NGINX, ['-p', dir, '-c', conf, '-e', path.join(dir, 'error.log')], {
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const errorLog = () => {
    try {
      return readFileSync(path.join(dir, 'error.log'), 'utf8');
    } catch {
      return '';
    }
  };
  const nginxExited = new Promise<void>((resolve) => nginx.once('exit', () => resolve()));
  // Ready when it answers through to an app process.
  const started = Date.now();
  for (;;) {
    const ok = await fetch(`${url}/api/health`).then(
      (r) => r.status < 500,
      () => false,
    );
    if (ok) break;
    if (nginx.exitCode !== null || Date.now() - started > 15_000)
      throw new Error(`nginx did not come up on ${url}: ${errorLog().slice(-500)}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    url,
    nodes,
    uploadDir,
    errorLog,
    async stop() {
      nginx.kill('SIGQUIT');
      for (const n of nodes) if (n.child.exitCode === null && n.child.signalCode === null) n.stop();
      await Promise.all([nginxExited, ...nodes.map((n) => n.exited)]);
      rmSync(dir, { recursive: true, force: true });
      rmSync(uploadDir, { recursive: true, force: true });
    },
  };
}
