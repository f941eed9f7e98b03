// E-mail through nodemailer. Locally the SMTP fake on loopback catches everything; the app's
// mail page lists what it caught through MAIL_CAPTURE_URL (development and tests only).
import nodemailer from 'nodemailer';
import { z } from 'zod';

export type OutgoingMail = { to: string | string[]; subject: string; text: string; html?: string };
export type CaughtMail = z.infer<typeof CaughtMail>;
const CaughtMail = z.object({
  id: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  date: z.string(),
  text: z.string(),
  html: z.string(),
});

export type Mailer = {
  send(mail: OutgoingMail): Promise<void>;
  caught(): Promise<CaughtMail[]>;
  hasCapture: boolean;
};

export function createMailer(opts: { smtpUrl: string; from: string; captureUrl?: string }): Mailer {
  const transport = nodemailer.createTransport(opts.smtpUrl);
  return {
    hasCapture: Boolean(opts.captureUrl),
    async send(mail) {
      await transport.sendMail({ from: opts.from, ...mail });
    },
    async caught() {
      if (!opts.captureUrl) return [];
      const res = await fetch(`${opts.captureUrl}/messages`);
      if (!res.ok) throw new Error(`mail capture answered ${res.status}`);
      return z.array(CaughtMail).parse(await res.json());
    },
  };
}

export const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
