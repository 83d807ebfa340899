// Runs the mail sink on its own: `tsx tools/mail-sink/cli.ts`. Ports from SMTP_PORT (1025) and
// MAIL_SINK_HTTP_PORT (1080). Refuses to run in production.
import { startMailSink } from './server';

function port(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0 || n > 65535) {
    console.error(`${name} must be a port number, not "${raw}".`);
    process.exit(1);
  }
  return n;
}

async function main(): Promise<void> {
  if (process.env['NODE_ENV'] === 'production' || process.env['TAPPET_MODE'] === 'production') {
    console.error('The mail sink is for demo and tests only; it does not run in production.');
    process.exit(1);
  }
  const sink = await startMailSink({ smtpPort: port('SMTP_PORT', 1025), httpPort: port('MAIL_SINK_HTTP_PORT', 1080) });
  console.log(`Mail sink: SMTP on 127.0.0.1:${sink.smtpPort}, inbox at http://127.0.0.1:${sink.httpPort}/`);
  const stop = () => {
    void sink.close().then(() => process.exit(0));
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
