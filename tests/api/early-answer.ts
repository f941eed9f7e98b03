// A test client for requests the server may answer before it has read the body (a 403 or 404 from the
// route table's guard, sent as soon as the headers arrive). supertest reports such a request as
// `write EPIPE` when the server's answer and the closing of the connection come while it is still
// writing; this client stops writing once an answer has come, and a write error after (or while) the
// answer arrives does not hide the answer.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { App } from '../../server/app';

export type EarlyAnswer = { status: number; body: unknown; headers: http.IncomingHttpHeaders };

export async function sendEarly(
  app: App,
  method: 'POST' | 'PUT',
  path: string,
  headers: Record<string, string>,
  body: Buffer,
): Promise<EarlyAnswer> {
  const server = app.listen(0, '127.0.0.1');
  await new Promise<void>((r) => server.once('listening', () => r()));
  const { port } = server.address() as AddressInfo;
  try {
    return await new Promise<EarlyAnswer>((resolve, reject) => {
      let answered = false;
      let writeError: Error | null = null;
      const req = http.request({
        host: '127.0.0.1',
        port,
        method,
        path,
        headers: { ...headers, 'content-length': String(body.length), connection: 'close' },
      });
      req.on('response', (res) => {
        answered = true;
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => {
          const text = Buffer.concat(chunks).toString('utf8');
          let parsed: unknown = text;
          try {
            parsed = JSON.parse(text);
          } catch {
            /* not JSON */
          }
          resolve({ status: res.statusCode ?? 0, body: parsed, headers: res.headers });
        });
        res.on('error', () => undefined);
      });
      req.on('error', (err: NodeJS.ErrnoException) => {
        // EPIPE / ECONNRESET while writing: the server answered and closed; give the answer time to be read.
        if (answered) return;
        if (err.code === 'EPIPE' || err.code === 'ECONNRESET') {
          writeError = err;
          setTimeout(() => {
            if (!answered) reject(writeError);
          }, 3000);
          return;
        }
        reject(err);
      });
      // Write in slices and stop as soon as an answer has come.
      const slice = 64 * 1024;
      let at = 0;
      const pump = () => {
        while (!answered && !writeError && at < body.length) {
          const more = req.write(body.subarray(at, at + slice));
          at += slice;
          if (!more) {
            req.once('drain', pump);
            return;
          }
        }
        if (!answered && !writeError) req.end();
      };
      pump();
    });
  } finally {
    server.closeAllConnections();
    await new Promise<void>((r) => server.close(() => r()));
  }
}
