// The request log at the level an operator reads (LOG_LEVEL=info): writes, refusals and errors,
// slow reads; a successful read only at debug.
import { Writable } from 'node:stream';
import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { requestLog } from '../../../server/http/request-log';
import { createLogger } from '../../../server/logger';

function appLoggingAt(level: string) {
  const lines: { level: number; req: { method: string; url: string }; res: { statusCode: number } }[] = [];
  const sink = new Writable({
    write(chunk, _encoding, done) {
      for (const l of chunk.toString().split('\n').filter(Boolean)) lines.push(JSON.parse(l));
      done();
    },
  });
  const app = express();
  app.use(requestLog(createLogger(level, sink)));
  app.get('/ok', (_req, res) => void res.json({ ok: true }));
  app.post('/ok', (_req, res) => void res.json({ ok: true }));
  app.get('/missing', (_req, res) => void res.status(404).json({}));
  return { app, lines };
}

describe('request log levels', () => {
  it('at info: a successful read writes no line; a write and a 404 do', async () => {
    const { app, lines } = appLoggingAt('info');
    await request(app).get('/ok').expect(200);
    await request(app).post('/ok').expect(200);
    await request(app).get('/missing').expect(404);
    await new Promise((r) => setTimeout(r, 50));
    expect(lines.map((l) => [l.level, l.req.method, l.req.url])).toEqual([
      [30, 'POST', '/ok'], // pino: 30 info
      [40, 'GET', '/missing'], // 40 warn
    ]);
  });

  it('at debug: every request has its line', async () => {
    const { app, lines } = appLoggingAt('debug');
    await request(app).get('/ok').expect(200);
    await new Promise((r) => setTimeout(r, 50));
    expect(lines.map((l) => [l.level, l.req.url])).toEqual([[20, '/ok']]);
  });
});
