import { Writable } from 'node:stream';
import pino from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestContext, type TestContext } from '../../../test-support/test-app';

const lines: string[] = [];
let ctx: TestContext;
beforeAll(async () => {
  const sink = new Writable({
    write(chunk: Buffer, _enc, cb) {
      lines.push(chunk.toString());
      cb();
    },
  });
  ctx = await createTestContext({ deps: { logger: pino({ level: 'info' }, sink) } });
});
afterAll(() => ctx.close());

it('keeps invitation tokens out of the access log', async () => {
  const token = 'secretInvitationToken0123456789abcdefghijk';
  await request(ctx.app).get(`/api/invitations/${token}`).expect(404);
  const log = lines.join('');
  expect(log).toContain('/api/invitations/[token]');
  expect(log).not.toContain(token);
});
