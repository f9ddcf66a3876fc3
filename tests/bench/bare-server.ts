// The ceiling for bench:api: a bare Express endpoint returning fixed JSON, in its own process like
// the app under test. Prints "READY <url>"; stops on SIGTERM.
import express from 'express';

const app = express();
app.get('/fixed', (_req, res) => res.json({ ok: true, procedures: 2004 }));
const server = app.listen(0, '127.0.0.1', () => {
  const { port } = server.address() as { port: number };
  console.log(`READY http://127.0.0.1:${port}`);
});
process.on('SIGTERM', () => server.close(() => process.exit(0)));
