import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** One captured e-mail. */
export interface SinkMessage {
  id: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** What was attached: name, type and size only (the bytes are not kept). */
  attachments: Array<{ filename: string | null; contentType: string; size: number }>;
  receivedAt: string;
}

export interface MailSinkOptions {
  /** SMTP port (0 = any free port). Default 1025. */
  smtpPort?: number;
  /** HTTP port of the inbox page and JSON API (0 = any free port). Default 1080. */
  httpPort?: number;
  /** Interface to listen on. Loopback only by default: the sink is never for the open network. */
  host?: string;
  /** Oldest messages are dropped beyond this many. */
  maxMessages?: number;
}

export interface MailSink {
  smtpPort: number;
  httpPort: number;
  /** Captured messages, oldest first. */
  messages: SinkMessage[];
  clear(): void;
  close(): Promise<void>;
}

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(value) ? value : value ? [value] : [];
  return list.flatMap((a) => a.value.map((v) => (v.address ?? '').toLowerCase())).filter(Boolean);
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** Escapes text and turns http(s) URLs into links (message HTML is never rendered: it could run script). */
function linkify(text: string): string {
  return escapeHtml(text).replace(/https?:\/\/[^\s<]+/g, (url) => `<a href="${url}">${url}</a>`);
}

function inboxPage(messages: SinkMessage[], selected: SinkMessage | undefined): string {
  const rows = [...messages]
    .reverse()
    .map(
      (m) => `<li${m === selected ? ' aria-current="true"' : ''}><a href="/?id=${encodeURIComponent(m.id)}"><strong>${escapeHtml(m.subject || '(no subject)')}</strong>
        <span>to ${escapeHtml(m.to.join(', '))}</span><time datetime="${m.receivedAt}">${escapeHtml(m.receivedAt.replace('T', ' ').slice(0, 19))}</time></a></li>`,
    )
    .join('\n');
  const body = selected
    ? `<article><h2>${escapeHtml(selected.subject || '(no subject)')}</h2>
       <p class="meta">From ${escapeHtml(selected.from)} to ${escapeHtml(selected.to.join(', '))}</p>
       <pre>${linkify(selected.text)}</pre></article>`
    : `<p class="empty">${messages.length ? 'Choose a message on the left.' : 'No mail yet. Messages sent to this sink appear here; reload to see new ones.'}</p>`;
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Tappet mail sink (${messages.length})</title>
<style>
  body { margin: 0; font: 16px/1.45 system-ui, sans-serif; background: #f7f4ec; color: #1f1d1a; }
  header { padding: 12px 20px; border-bottom: 1px solid #d8d2c4; display: flex; gap: 16px; align-items: center; }
  h1 { font-size: 20px; margin: 0; } header p { margin: 0; color: #5a554d; }
  main { display: grid; grid-template-columns: minmax(240px, 360px) 1fr; min-height: calc(100vh - 50px); }
  ul { list-style: none; margin: 0; padding: 0; border-right: 1px solid #d8d2c4; }
  li a { display: grid; padding: 10px 16px; min-height: 44px; color: inherit; text-decoration: none; border-bottom: 1px solid #e6e0d2; }
  li[aria-current] a { background: #fffdf7; box-shadow: inset 4px 0 #0f5c5c; }
  li span, li time, .meta { color: #5a554d; font-size: 14px; }
  article, .empty { padding: 16px 24px; } h2 { font-size: 20px; margin: 0 0 4px; }
  pre { font: 14px/1.5 ui-monospace, monospace; white-space: pre-wrap; background: #fffdf7; padding: 16px; border: 1px solid #e6e0d2; }
  a { color: #0f5c5c; } a:focus-visible { outline: 3px solid #0f5c5c; outline-offset: 2px; }
  @media (max-width: 720px) { main { grid-template-columns: 1fr; } ul { border-right: 0; } }
</style></head>
<body><header><h1>Tappet mail sink</h1><p>Local development only: mail sent here goes nowhere else.</p></header>
<main><nav aria-label="Messages"><ul>${rows}</ul></nav><section aria-label="Message">${body}</section></main></body></html>`;
}

function sendJson(res: http.ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { 'Content-Type': 'application/json; charset=utf-8', 'Cache-Control': 'no-store' });
  res.end(JSON.stringify(body));
}

/**
 * Starts the local SMTP sink (smtp-server + mailparser) and its HTTP side: an inbox page at `/`
 * and a JSON API (`GET /messages?to=`, `GET /messages/:id`, `DELETE /messages`). Messages live in
 * memory. For demo and tests only: never start it in production.
 */
export async function startMailSink(options: MailSinkOptions = {}): Promise<MailSink> {
  const host = options.host ?? '127.0.0.1';
  const maxMessages = options.maxMessages ?? 500;
  const messages: SinkMessage[] = [];
  let counter = 0;

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    size: 10 << 20,
    banner: 'Tappet mail sink',
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream).then((parsed) => {
        counter += 1;
        messages.push({
          id: `${Date.now().toString(36)}-${counter}`,
          from: addresses(parsed.from)[0] ?? '',
          to: addresses(parsed.to),
          subject: parsed.subject ?? '',
          text: parsed.text ?? '',
          html: typeof parsed.html === 'string' ? parsed.html : null,
          attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? null, contentType: a.contentType, size: a.size })),
          receivedAt: new Date().toISOString(),
        });
        if (messages.length > maxMessages) messages.splice(0, messages.length - maxMessages);
        callback();
      }, callback);
    },
  });

  const web = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://sink.invalid');
    const byId = /^\/messages\/([^/]+)$/.exec(url.pathname);
    if (req.method === 'GET' && url.pathname === '/messages') {
      const to = url.searchParams.get('to')?.toLowerCase();
      return sendJson(res, 200, to ? messages.filter((m) => m.to.includes(to)) : messages);
    }
    if (req.method === 'GET' && byId) {
      const found = messages.find((m) => m.id === decodeURIComponent(byId[1]!));
      return found ? sendJson(res, 200, found) : sendJson(res, 404, { error: { code: 'not_found', message: 'No such message.' } });
    }
    if (req.method === 'DELETE' && url.pathname === '/messages') {
      messages.length = 0;
      res.writeHead(204).end();
      return;
    }
    if (req.method === 'GET' && url.pathname === '/') {
      const selected = messages.find((m) => m.id === url.searchParams.get('id'));
      res.writeHead(200, {
        'Content-Type': 'text/html; charset=utf-8',
        'Cache-Control': 'no-store',
        'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; frame-ancestors 'none'",
      });
      res.end(inboxPage(messages, selected));
      return;
    }
    sendJson(res, 404, { error: { code: 'not_found', message: 'No such route.' } });
  });

  const listen = (server: { listen: (port: number, host: string, cb: () => void) => unknown; once: (e: string, cb: (err: Error) => void) => unknown }, port: number) =>
    new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, host, resolve);
    });
  await listen(smtp.server, options.smtpPort ?? 1025);
  try {
    await listen(web, options.httpPort ?? 1080);
  } catch (err) {
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw err;
  }

  return {
    smtpPort: (smtp.server.address() as AddressInfo).port,
    httpPort: (web.address() as AddressInfo).port,
    messages,
    clear: () => {
      messages.length = 0;
    },
    close: async () => {
      web.closeAllConnections();
      await Promise.all([new Promise<void>((resolve) => web.close(() => resolve())), new Promise<void>((resolve) => smtp.close(() => resolve()))]);
    },
  };
}
