import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestContext } from '../test-support/test-app';

let ctx: TestContext;
let dir: string;
beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-static-'));
  fs.mkdirSync(path.join(dir, 'web/assets'), { recursive: true });
  fs.mkdirSync(path.join(dir, 'fonts'));
  fs.writeFileSync(path.join(dir, 'web/index.html'), '<!doctype html><title>Tappet</title>');
  fs.writeFileSync(path.join(dir, 'web/assets/index-abc123.js'), 'console.log(1)');
  fs.writeFileSync(path.join(dir, 'web/assets/big-abc123.js'), `export const words = ${JSON.stringify('lookup '.repeat(20_000))};`);
  fs.writeFileSync(path.join(dir, 'fonts/body.woff2'), 'font-bytes');
  ctx = await createTestContext({ deps: { webDir: path.join(dir, 'web'), fontsDir: path.join(dir, 'fonts') } });
});
afterAll(async () => {
  await ctx.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('serving the web app and fonts', () => {
  it('answers client-side routes with index.html (SPA fallback)', async () => {
    for (const url of ['/', '/reset-password?token=abc', '/shops/some-id/parts']) {
      const res = await request(ctx.app).get(url).set('Accept', 'text/html');
      expect(res.status, url).toBe(200);
      expect(res.text).toContain('<title>Tappet</title>');
      expect(res.headers['cache-control']).toBe('no-cache');
    }
  });

  it('sends scripts compressed to a browser that accepts it, and plain to one that does not', async () => {
    const size = fs.statSync(path.join(dir, 'web/assets/big-abc123.js')).size;
    // supertest decompresses what it receives, so the header is what shows the compression.
    const br = await request(ctx.app).get('/assets/big-abc123.js').set('Accept-Encoding', 'br, gzip');
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.text.length).toBe(size);
    const gzip = await request(ctx.app).get('/assets/big-abc123.js').set('Accept-Encoding', 'gzip');
    expect(gzip.headers['content-encoding']).toBe('gzip');
    const plain = await request(ctx.app).get('/assets/big-abc123.js').set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.text.length).toBe(size);
  });

  it('does not compress API answers', async () => {
    const res = await request(ctx.app).get('/api/openapi.json').set('Accept-Encoding', 'br, gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBeUndefined();
  });

  it('never answers /api with the SPA', async () => {
    const res = await request(ctx.app).get('/api/unknown').set('Accept', 'text/html');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('caches hashed assets and fonts for a year', async () => {
    const asset = await request(ctx.app).get('/assets/index-abc123.js');
    expect(asset.status).toBe(200);
    expect(asset.headers['cache-control']).toMatch(/max-age=31536000.*immutable/);
    const font = await request(ctx.app).get('/fonts/body.woff2');
    expect(font.status).toBe(200);
    expect(font.headers['cache-control']).toMatch(/max-age=31536000.*immutable/);
  });

  it('answers a missing font or asset with a JSON 404, not the SPA', async () => {
    const res = await request(ctx.app).get('/fonts/missing.woff2');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect((await request(ctx.app).get('/assets/missing.js')).status).toBe(404);
  });
});
