// The local SMTP stand-in: accepts every message on loopback, parses it with mailparser and
// keeps it in memory (and in a JSON file, so a restart keeps the outbox). A small HTTP listing on
// loopback lets the app's mail page and the tests read what was caught.
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import { createServer } from 'node:http';
import { mkdirSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { randomUUID } from 'node:crypto';

type Caught = { id: string; from: string; to: string[]; subject: string; date: string; text: string; html: string };
const smtpPort = Number(process.env.SMTP_PORT ?? 25250);
const httpPort = Number(process.env.MAIL_HTTP_PORT ?? 25260);
const dir = `${process.env.LOCAL_DIR ?? '.local/dev'}/mail`;
mkdirSync(dir, { recursive: true });
const file = `${dir}/caught.json`;
const messages: Caught[] = existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as Caught[]) : [];

const addresses = (a: AddressObject | AddressObject[] | undefined): string[] =>
  (Array.isArray(a) ? a : a ? [a] : []).flatMap((o) => o.value.map((v) => v.address ?? '')).filter(Boolean);

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  logger: false,
  onData(stream, _session, callback) {
    simpleParser(stream)
      .then((mail) => {
        messages.push({
          id: randomUUID(),
          from: addresses(mail.from)[0] ?? '',
          to: addresses(mail.to),
          subject: mail.subject ?? '',
          date: (mail.date ?? new Date()).toISOString(),
          text: mail.text ?? '',
          html: typeof mail.html === 'string' ? mail.html : '',
        });
        writeFileSync(file, JSON.stringify(messages));
        callback();
      })
      .catch((err: Error) => callback(err));
  },
});
smtp.listen(smtpPort, '127.0.0.1');

const http = createServer((req, res) => {
  if (req.method === 'GET' && req.url === '/messages') {
    res.writeHead(200, { 'content-type': 'application/json' });
    res.end(JSON.stringify(messages));
  } else if (req.method === 'DELETE' && req.url === '/messages') {
    messages.length = 0;
    writeFileSync(file, '[]');
    res.writeHead(204).end();
  } else {
    res.writeHead(404).end();
  }
});
http.listen(httpPort, '127.0.0.1', () =>
  console.log(`[sigmaline] SMTP fake on 127.0.0.1:${smtpPort}, listing on http://127.0.0.1:${httpPort}/messages`),
);
const stop = () => {
  smtp.close(() => http.close(() => process.exit(0)));
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
