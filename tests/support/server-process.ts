// A second Benchwright server in its own process, on the database given in DATABASE_URL:
// prints "READY <url>" once listening; stops on SIGTERM.
import { startServer } from '../../server/index';
import { createLogger } from '../../server/logger';

const running = await startServer({
  databaseUrl: process.env.DATABASE_URL!,
  port: 0,
  logger: createLogger(process.env.LOG_LEVEL ?? 'silent'),
  config: { sessionSecret: 'second-process-secret'.padEnd(40, 'x') },
});
console.log(`READY ${running.url}`);
process.on('SIGTERM', () => void running.close().then(() => process.exit(0)));
