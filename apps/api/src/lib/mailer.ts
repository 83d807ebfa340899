import nodemailer from 'nodemailer';
import type { Env } from '../config/env';

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Files sent with the message (e.g. a purchase order PDF); nodemailer's attachment shape. */
  attachments?: Array<{ filename: string; content: Buffer; contentType: string }>;
}

/** Sends e-mail. Never call it inside a db.write(): the write lock must not wait on the network. */
export interface Mailer {
  send(message: MailMessage): Promise<void>;
}

/** An SMTP mailer from the environment (in demo mode: the local sink on 127.0.0.1:1025). */
export function createSmtpMailer(env: Env): Mailer {
  const local = env.mode !== 'production';
  const transport = nodemailer.createTransport({
    host: env.smtp.host,
    port: env.smtp.port,
    secure: env.smtp.port === 465,
    // The local sink speaks plain SMTP; real servers must offer STARTTLS.
    ignoreTLS: local,
    requireTLS: !local && env.smtp.port !== 465,
    auth: env.smtp.user && env.smtp.pass ? { user: env.smtp.user, pass: env.smtp.pass } : undefined,
  });
  return {
    async send(message) {
      await transport.sendMail({ from: env.smtp.from, ...message });
    },
  };
}

/** A mailer that keeps messages in `outbox` instead of sending them. For tests. */
export function createMemoryMailer(): Mailer & { outbox: MailMessage[] } {
  const outbox: MailMessage[] = [];
  return {
    outbox,
    async send(message) {
      outbox.push(message);
    },
  };
}
