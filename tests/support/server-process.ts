// A Benchwright server in its own process, on the database given in DATABASE_URL: prints
// "READY <url>" once listening; stops on SIGTERM. BW_TEST_PORT fixes its port; BW_TEST_CONFIG
// (JSON) adds settings such as smtp, uploadDir or trustProxy.
import { startServer } from '../../server/index';
import { createLogger } from '../../server/logger';

const running = await startServer({
  databaseUrl: process.env.DATABASE_URL!,
  port: Number(process.env.BW_TEST_PORT ?? 0),
  logger: createLogger(process.env.LOG_LEVEL ?? 'silent'),
  config: {
    sessionSecret: 'second-process-secret'.padEnd(40, 'x'),
    ...(JSON.parse(process.env.BW_TEST_CONFIG ?? '{}') as object),
  },
});
console.log(`READY ${running.url}`);
process.on('SIGTERM', () => void running.close().then(() => process.exit(0)));
