// One app process of `WORKERS=N npm start` (forked by start.ts through node:cluster): the settings
// come from the primary in BW_WORKER; the port is shared by every worker.
import { startServer } from '../index';

const settings = JSON.parse(process.env.BW_WORKER!) as Parameters<typeof startServer>[0];
const running = await startServer(settings);
let stopping = false;
const stop = () => {
  if (stopping) return;
  stopping = true;
  void running.close().then(() => process.exit(0));
};
// Ctrl+C reaches every process of the group; the primary also sends SIGTERM.
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
