import nodemailer from 'nodemailer';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startMailSink, type MailSink } from './server';

let sink: MailSink;
beforeAll(async () => {
  sink = await startMailSink({ smtpPort: 0, httpPort: 0 });
});
afterAll(() => sink.close());
beforeEach(() => sink.clear());

const api = (path: string, init?: RequestInit) => fetch(`http://127.0.0.1:${sink.httpPort}${path}`, init);

async function send(to: string, subject: string, text: string) {
  const transport = nodemailer.createTransport({ host: '127.0.0.1', port: sink.smtpPort, secure: false, ignoreTLS: true });
  await transport.sendMail({ from: 'Tappet <no-reply@tappet.test>', to, subject, text });
}

describe('mail sink', () => {
  it('captures mail sent over SMTP and serves it as JSON, filtered by recipient', async () => {
    await send('Owner@Harbour-Works.test', 'Reset your password', 'Open http://localhost:3000/reset-password?token=abc');
    await send('buyer@harbour-works.test', 'Order sent', 'Purchase order 12');
    const all = (await (await api('/messages')).json()) as Array<{ id: string; to: string[]; subject: string }>;
    expect(all.map((m) => m.subject)).toEqual(['Reset your password', 'Order sent']);

    const forOwner = (await (await api('/messages?to=owner@harbour-works.test')).json()) as typeof all;
    expect(forOwner).toHaveLength(1);
    expect(forOwner[0]!.to).toEqual(['owner@harbour-works.test']);

    const one = await api(`/messages/${forOwner[0]!.id}`);
    expect(one.status).toBe(200);
    expect(((await one.json()) as { text: string }).text).toContain('reset-password?token=abc');
    expect((await api('/messages/nope')).status).toBe(404);
  });

  it('lists what was attached (name, type, size), without keeping the bytes', async () => {
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: sink.smtpPort, secure: false, ignoreTLS: true });
    await transport.sendMail({ from: 'Tappet <no-reply@tappet.test>', to: 'orders@marrick.test', subject: 'Order PO-000001', text: 'Attached.', attachments: [{ filename: 'PO-000001.pdf', content: Buffer.alloc(1234, 1), contentType: 'application/pdf' }] });
    const [message] = (await (await api('/messages?to=orders@marrick.test')).json()) as Array<{ attachments: unknown[] }>;
    expect(message!.attachments).toEqual([{ filename: 'PO-000001.pdf', contentType: 'application/pdf', size: 1234 }]);
  });

  it('empties the inbox on DELETE /messages', async () => {
    await send('viewer@harbour-works.test', 'Hello', 'Hi');
    expect((await api('/messages', { method: 'DELETE' })).status).toBe(204);
    expect(await (await api('/messages')).json()).toEqual([]);
  });

  it('shows an inbox page that escapes what it shows and links URLs', async () => {
    await send('viewer@harbour-works.test', '<script>alert(1)</script>', 'Go to https://tappet.test/x');
    const list = (await (await api('/messages')).json()) as Array<{ id: string }>;
    const page = await (await api(`/?id=${list[0]!.id}`)).text();
    expect(page).toContain('Tappet mail sink');
    expect(page).not.toContain('<script>alert(1)</script>');
    expect(page).toContain('<a href="https://tappet.test/x">');
  });
});
