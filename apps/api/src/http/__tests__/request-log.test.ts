import { Writable } from 'node:stream';
import express from 'express';
import pino from 'pino';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { accessLogPath, requestLog } from '../request-log';

function appLoggingTo(lines: Array<Record<string, unknown>>) {
  const sink = new Writable({
    write(chunk: Buffer, _enc, cb) {
      for (const line of chunk.toString().split('\n').filter(Boolean)) lines.push(JSON.parse(line) as Record<string, unknown>);
      cb();
    },
  });
  const app = express();
  app.use(requestLog(pino({ level: 'info' }, sink), (url) => url === '/skipped'));
  app.get('/ok', (_req, res) => void res.json({ fine: true }));
  app.get('/broken', (_req, res) => void res.status(500).json({ error: 'x' }));
  app.get('/skipped', (_req, res) => void res.json({}));
  return app;
}

describe('the access log', () => {
  it('writes method, path without its query, status and time, and nothing of the headers', async () => {
    const lines: Array<Record<string, unknown>> = [];
    await request(appLoggingTo(lines)).get('/ok?token=secret-reset-token').set('Cookie', 'tappet_session=secret-cookie').expect(200);
    expect(lines).toHaveLength(1);
    const [line] = lines;
    expect(line).toMatchObject({ level: 30, msg: 'request completed', req: { method: 'GET', path: '/ok' }, res: { statusCode: 200 } });
    expect(typeof line!['responseTime']).toBe('number');
    expect(JSON.stringify(line)).not.toMatch(/secret/);
  });

  it('logs a server error at error level, numbers requests, and leaves out skipped paths', async () => {
    const lines: Array<Record<string, unknown>> = [];
    const app = appLoggingTo(lines);
    await request(app).get('/skipped').expect(200);
    await request(app).get('/broken').expect(500);
    await request(app).get('/ok').expect(200);
    expect(lines.map((l) => [l['level'], l['msg']])).toEqual([
      [50, 'request failed'],
      [30, 'request completed'],
    ]);
    const ids = lines.map((l) => (l['req'] as { id: number }).id);
    expect(ids[1]).toBeGreaterThan(ids[0]!);
  });

  it('masks invitation tokens but keeps the accept route', () => {
    expect(accessLogPath('/api/invitations/abcDEF123?x=1')).toBe('/api/invitations/[token]');
    expect(accessLogPath('/api/invitations/accept')).toBe('/api/invitations/accept');
    expect(accessLogPath('/api/shops/1/parts/search?q=AB')).toBe('/api/shops/1/parts/search');
  });
});
