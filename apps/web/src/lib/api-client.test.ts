import { afterEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { installFakeApi } from '../testing/fake-api';
import { ApiError, api, fieldErrorsFrom } from './api-client';

afterEach(() => vi.unstubAllGlobals());

describe('api client', () => {
  it('sends the CSRF header and a JSON body on writes, with same-origin cookies', async () => {
    const { requests } = installFakeApi({ 'PATCH /shops/x': () => ({ body: { ok: true } }) });
    await api.patch('/shops/x', { name: 'Harbour Works' });
    expect(requests[0]).toMatchObject({
      method: 'PATCH',
      path: '/shops/x',
      body: { name: 'Harbour Works' },
      credentials: 'same-origin',
      headers: { 'x-csrf': '1', 'content-type': 'application/json' },
    });
  });

  it('sends an empty JSON object when a write has no body (the API wants JSON on every write)', async () => {
    const { requests } = installFakeApi({ 'POST /auth/sign-out': () => ({ body: { ok: true } }) });
    await api.post('/auth/sign-out');
    expect(requests[0]?.body).toEqual({});
  });

  it('sends no CSRF header on reads', async () => {
    const { requests } = installFakeApi({ 'GET /health': () => ({ body: { status: 'ok' } }) });
    await expect(api.get('/health')).resolves.toEqual({ status: 'ok' });
    expect(requests[0]?.headers).not.toHaveProperty('x-csrf');
  });

  it('turns the error shape into an ApiError with field errors', async () => {
    installFakeApi({
      'POST /auth/sign-in': () => ({
        status: 400,
        body: {
          error: {
            code: 'validation_failed',
            message: 'Check the highlighted fields.',
            details: [
              { path: ['email'], message: 'Enter an e-mail address.' },
              { path: 'password', message: 'Enter your password.' },
            ],
          },
        },
      }),
    });
    const error = await api.post('/auth/sign-in', {}).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 400,
      code: 'validation_failed',
      message: 'Check the highlighted fields.',
      fieldErrors: { email: 'Enter an e-mail address.', password: 'Enter your password.' },
    });
  });

  it('keeps the rate-limit message to show it', async () => {
    installFakeApi({
      'POST /auth/sign-in': () => ({ status: 429, body: { error: { code: 'rate_limited', message: 'Too many failed sign-in attempts. Try again in 5 minutes.' } } }),
    });
    await expect(api.post('/auth/sign-in', {})).rejects.toMatchObject({ status: 429, code: 'rate_limited', message: 'Too many failed sign-in attempts. Try again in 5 minutes.' });
  });

  it('explains a failure whose body is not the error shape', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => new Response('<html>Bad gateway</html>', { status: 502 })));
    await expect(api.get('/me')).rejects.toMatchObject({ status: 502, code: 'internal' });
  });

  it('reports an unreachable server as a network error', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))));
    await expect(api.get('/me')).rejects.toMatchObject({ status: 0, code: 'network' });
  });

  it('rejects a response that does not match the expected schema', async () => {
    installFakeApi({ 'GET /health': () => ({ body: { status: 'broken' } }) });
    await expect(api.get('/health', { schema: z.object({ status: z.literal('ok') }) })).rejects.toMatchObject({ code: 'unexpected_response' });
  });
});

describe('fieldErrorsFrom', () => {
  it('joins nested paths and keeps the first message per field', () => {
    expect(
      fieldErrorsFrom([
        { path: ['lines', 0, 'qty'], message: 'Enter a quantity.' },
        { path: ['lines', 0, 'qty'], message: 'Second message.' },
        { path: [], message: 'Form-level.' },
        'junk',
      ]),
    ).toEqual({ 'lines.0.qty': 'Enter a quantity.' });
    expect(fieldErrorsFrom(undefined)).toEqual({});
  });
});
