// E-mail through nodemailer. Locally the SMTP fake on loopback catches everything; the app's
// mail page lists what it caught through MAIL_CAPTURE_URL (development and tests only).
import nodemailer from 'nodemailer';
import { z } from 'zod';

/**
 * A subject made of fixed words only, never of text a user chose (a cruise, a person or a file name
 * in a subject turns the app into a relay for someone else's message; issue #14, item 6). Only
 * `MAIL_SUBJECTS` makes one, so a new mail cannot put user text there by accident; user text goes
 * in the body, `quoted`.
 */
export type MailSubject = string & { readonly __mailSubject: unique symbol };
const fixed = (s: string) => s as MailSubject;
const INVITED_AS = {
  chief_scientist: 'chief scientist',
  technician: 'technician',
  analyst: 'analyst',
  pi: 'principal investigator',
} as const;
export const MAIL_SUBJECTS = {
  reset: fixed('Sigmaline: reset your password'),
  release: fixed('Sigmaline: data released on one of your cruises'),
  invitation: (role: keyof typeof INVITED_AS) =>
    fixed(`Sigmaline: an invitation to join a cruise as ${INVITED_AS[role]}`),
};

/** User text in a mail body: one line, in quotes, so it reads as a name and not as the message. */
export const quoted = (s: string) =>
  `"${s
    .replace(/[\r\n\t]+/g, ' ')
    .replace(/"/g, "'")
    .slice(0, 200)}"`;

export type OutgoingMail = { to: string | string[]; subject: MailSubject; text: string; html?: string };
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
