import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createTestContext, csrf, seedShop, sessionTokenFrom, type TestContext } from '../../../test-support/test-app';
import { AuditEventEntity } from '../../audit/audit.entity';

let ctx: TestContext;
let shop: Awaited<ReturnType<typeof seedShop>>;
beforeAll(async () => {
  ctx = await createTestContext();
  shop = await seedShop(ctx, ['owner', 'mechanic', 'buyer', 'viewer']);
});
afterAll(() => ctx.close());

const post = (url: string, body: object) => request(ctx.app).post(url).set(csrf).send(body);
const signIn = (email: string, password: string) => post('/api/auth/sign-in', { email, password });

/** Asks for a reset of `email` and returns the token from the e-mail that arrives. */
async function requestResetToken(email: string): Promise<string> {
  const before = ctx.mailer.outbox.length;
  const res = await post('/api/auth/password-reset/request', { email });
  expect(res.status).toBe(200);
  await vi.waitFor(() => expect(ctx.mailer.outbox.length).toBe(before + 1));
  const mail = ctx.mailer.outbox[before]!;
  expect(mail.to).toBe(email);
  const link = /(\S+\/reset-password\?token=\S+)/.exec(mail.text)?.[1];
  expect(link).toBeDefined();
  return new URL(link!).searchParams.get('token')!;
}

describe('password reset', () => {
  it('works end to end: link from PUBLIC_URL, new password, every session ended, token single-use', async () => {
    const { email } = shop.byRole.mechanic;
    const cookie = `tappet_session=${sessionTokenFrom(await signIn(email, shop.password))}`;
    expect((await request(ctx.app).get('/api/me').set('Cookie', cookie)).status).toBe(200);

    // A forged Host header must not end up in the link.
    const before = ctx.mailer.outbox.length;
    await request(ctx.app).post('/api/auth/password-reset/request').set(csrf).set('Host', 'evil.test').send({ email });
    await vi.waitFor(() => expect(ctx.mailer.outbox.length).toBe(before + 1));
    expect(ctx.mailer.outbox[before]!.text).toContain('http://tappet.test/reset-password?token=');
    expect(ctx.mailer.outbox[before]!.text).not.toContain('evil.test');

    const token = await requestResetToken(email);
    const confirm = await post('/api/auth/password-reset/confirm', { token, password: 'a brand new long one' });
    expect(confirm.status).toBe(200);

    expect((await request(ctx.app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
    expect((await signIn(email, shop.password)).status).toBe(401);
    expect((await signIn(email, 'a brand new long one')).status).toBe(200);

    const reuse = await post('/api/auth/password-reset/confirm', { token, password: 'yet another long one' });
    expect(reuse.status).toBe(400);
    expect(reuse.body.error.message).toMatch(/invalid, used or expired/);
    // The earlier link (sent with the forged Host) was voided by the reset as well.
    const earlier = new URL(/(\S+reset-password\?token=\S+)/.exec(ctx.mailer.outbox[before]!.text)![1]!).searchParams.get('token')!;
    expect((await post('/api/auth/password-reset/confirm', { token: earlier, password: 'yet another long one' })).status).toBe(400);

    const audit = await ctx.db.reader.find(AuditEventEntity, { where: { action: 'user.password_reset', entityId: shop.byRole.mechanic.id } });
    expect(audit).toHaveLength(1);
    expect(JSON.stringify(audit[0]!.changes)).not.toContain('a brand new long one');
  });

  it('refuses a link older than 60 minutes', async () => {
    const token = await requestResetToken(shop.byRole.buyer.email);
    ctx.clock.advance(61 * 60_000);
    const res = await post('/api/auth/password-reset/confirm', { token, password: 'a brand new long one' });
    expect(res.status).toBe(400);
    expect((await signIn(shop.byRole.buyer.email, shop.password)).status).toBe(200);
  });

  it('answers the same for an unknown address and sends nothing', async () => {
    const before = ctx.mailer.outbox.length;
    const unknown = await post('/api/auth/password-reset/request', { email: 'nobody@nowhere.test' });
    const known = await post('/api/auth/password-reset/request', { email: shop.byRole.viewer.email });
    expect(unknown.status).toBe(200);
    expect(unknown.body).toEqual(known.body);
    await vi.waitFor(() => expect(ctx.mailer.outbox.length).toBe(before + 1));
    expect(ctx.mailer.outbox.map((m) => m.to)).not.toContain('nobody@nowhere.test');
  });

  it('refuses one of the most common passwords with a clear message', async () => {
    const token = await requestResetToken(shop.byRole.owner.email);
    const res = await post('/api/auth/password-reset/confirm', { token, password: 'Password123' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.details).toEqual([{ path: ['password'], message: expect.stringMatching(/most common/) }]);
    // The token was not used up by the refusal.
    expect((await post('/api/auth/password-reset/confirm', { token, password: 'harbour lantern gearbox' })).status).toBe(200);
  });

  it('refuses a password shorter than 8 characters', async () => {
    const res = await post('/api/auth/password-reset/confirm', { token: 'x'.repeat(43), password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toEqual(['password']);
  });

  it('rate-limits reset requests for one address', async () => {
    const email = 'flood@nowhere.test';
    for (let i = 0; i < 5; i++) expect((await post('/api/auth/password-reset/request', { email })).status).toBe(200);
    const res = await post('/api/auth/password-reset/request', { email });
    expect(res.status).toBe(429);
    expect(res.body.error.code).toBe('rate_limited');
  });
});
