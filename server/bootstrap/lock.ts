import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { dataDir } from './prepare';

const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

/**
 * One running `npm start` per checkout. A second one reads the lock, says where the first one is
 * and exits before touching the database.
 */
export function acquireStartLock(url: string): () => void {
  const file = path.join(dataDir, 'start.lock');
  if (existsSync(file)) {
    const held = JSON.parse(readFileSync(file, 'utf8')) as { pid: number; url: string };
    if (alive(held.pid) && held.pid !== process.pid) {
      console.error(
        `[benchwright] Benchwright is already running from this folder (pid ${held.pid}) at ${held.url}.`,
      );
      console.error('[benchwright] Stop that one first (Ctrl+C in its terminal) or open the address above.');
      process.exit(1);
    }
  }
  writeFileSync(file, JSON.stringify({ pid: process.pid, url }));
  return () => rmSync(file, { force: true });
}
