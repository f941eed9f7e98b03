// Helpers for the scale-out, fault, security and backup tests: free ports, invented cast files,
// zips and multipart bodies, child web/worker processes, a private S3 fake and a private PostgreSQL
// cluster. Everything started here is stopped by the caller (afterAll) and, as a last resort,
// killed when the test process exits.
import { spawn, execFileSync, type ChildProcess } from 'node:child_process';
import { chownSync, chmodSync, mkdtempSync, mkdirSync, rmSync } from 'node:fs';
import { createServer, type AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import S3rver from 's3rver';
import yazl from 'yazl';

export const ROOT = process.cwd();
export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.on('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const p = (s.address() as AddressInfo).port;
      s.close(() => resolve(p));
    });
  });
}

// ---------------------------------------------------------------------------------------------
// Invented cast files

/** A small deterministic pseudo-random generator, so every generated file is distinct but repeatable. */
function rng(seed: number) {
  let s = (seed * 2654435761) >>> 0 || 1;
  return () => {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    return s / 4294967296;
  };
}

export type CastSpec = {
  station: string;
  cast?: string;
  latitude?: number;
  longitude?: number;
  time?: string;
  bottomDepth?: number;
  maxP?: number;
  step?: number;
  seed?: number;
};

/** A plain cast CSV as api.md describes: warm salty surface (~20 °C, ~35.5) cooling to ~2 °C and
 * freshening to ~34.7 at depth, stably stratified, with tiny station-specific noise. */
export function castCsv(o: CastSpec): string {
  const r = rng(o.seed ?? [...o.station].reduce((a, c) => a * 31 + c.charCodeAt(0), 7));
  const maxP = o.maxP ?? 1000;
  const step = o.step ?? 2;
  const lines = [
    `# station: ${o.station}`,
    `# cast: ${o.cast ?? '1'}`,
    `# latitude: ${(o.latitude ?? -35.25).toFixed(4)}`,
    `# longitude: ${(o.longitude ?? -20.5).toFixed(4)}`,
    `# time: ${o.time ?? '2026-03-04T05:06:00Z'}`,
    `# bottom_depth: ${o.bottomDepth ?? Math.round(maxP * 0.99 + 40)}`,
    'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]',
  ];
  const dT = (r() - 0.5) * 0.6;
  const dS = (r() - 0.5) * 0.06;
  for (let p = step; p <= maxP + 1e-9; p += step) {
    const t = 2 + (18 + dT) * Math.exp(-p / 650) + 0.0004 * (r() - 0.5);
    const s = 34.7 + (0.82 + dS) * Math.exp(-p / 450) + 0.0002 * (r() - 0.5);
    lines.push(`${p.toFixed(1)},${t.toFixed(4)},${s.toFixed(4)}`);
  }
  return lines.join('\n') + '\n';
}

/** A zip of the given entries. yazl refuses unsafe names, so an entry may give `rawName`: it is
 * written under a placeholder of the same length and the name bytes are patched afterwards. */
export async function zipBuffer(entries: { name: string; data: Buffer | string; rawName?: string }[]): Promise<Buffer> {
  const zip = new yazl.ZipFile();
  const patches: [string, string][] = [];
  entries.forEach((e) => {
    let name = e.name;
    if (e.rawName) {
      name = randomBytes(e.rawName.length).toString('hex').slice(0, e.rawName.length);
      patches.push([name, e.rawName]);
    }
    zip.addBuffer(Buffer.isBuffer(e.data) ? e.data : Buffer.from(e.data), name, {
      mtime: new Date('2026-03-04T00:00:00Z'),
    });
  });
  zip.end();
  const chunks: Buffer[] = [];
  for await (const c of zip.outputStream) chunks.push(c as Buffer);
  const buf = Buffer.concat(chunks);
  for (const [from, to] of patches) {
    const a = Buffer.from(from),
      b = Buffer.from(to);
    let at = buf.indexOf(a);
    let n = 0;
    while (at >= 0) {
      b.copy(buf, at);
      n++;
      at = buf.indexOf(a, at + 1);
    }
    if (n < 2) throw new Error(`zip name patch of ${from} found ${n} copies`);
  }
  return buf;
}

/** A multipart/form-data body with the files under one field, byte for byte as given (file names
 * are not touched, so `../` reaches the server as sent). */
export function multipart(
  files: { filename: string; data: Buffer | string; contentType?: string }[],
  field = 'files',
  boundary = `----sigmaline${randomBytes(8).toString('hex')}`,
) {
  const parts: Buffer[] = [];
  for (const f of files) {
    parts.push(
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="${field}"; filename="${f.filename.replace(/"/g, '%22')}"\r\nContent-Type: ${f.contentType ?? 'text/csv'}\r\n\r\n`,
      ),
    );
    parts.push(Buffer.isBuffer(f.data) ? f.data : Buffer.from(f.data));
    parts.push(Buffer.from('\r\n'));
  }
  parts.push(Buffer.from(`--${boundary}--\r\n`));
  return { body: Buffer.concat(parts), contentType: `multipart/form-data; boundary=${boundary}` };
}

// ---------------------------------------------------------------------------------------------
// An HTTP session against a process listening on loopback (cookie jar of one cookie + CSRF token)

export class Session {
  cookie: string | null = null;
  csrf: string | null = null;
  constructor(public base: string) {}
  async req(
    method: string,
    path: string,
    opts: { json?: unknown; body?: Buffer; contentType?: string; headers?: Record<string, string>; base?: string } = {},
  ) {
    const headers: Record<string, string> = { ...(opts.headers ?? {}) };
    if (this.cookie) headers.cookie = this.cookie;
    if (this.csrf && method !== 'GET') headers['x-csrf-token'] = this.csrf;
    let body: Buffer | string | undefined;
    if (opts.json !== undefined) {
      body = JSON.stringify(opts.json);
      headers['content-type'] = 'application/json';
    }
    if (opts.body) {
      body = opts.body;
      headers['content-type'] = opts.contentType ?? 'application/octet-stream';
    }
    const res = await fetch((opts.base ?? this.base) + path, {
      method,
      headers,
      body: body as BodyInit | undefined,
      signal: AbortSignal.timeout(30_000),
    });
    const set = res.headers.getSetCookie().find((c) => c.startsWith('sigmaline.sid='));
    if (set) this.cookie = set.split(';')[0];
    const text = await res.text();
    let data: any = text; // eslint-disable-line @typescript-eslint/no-explicit-any
    try {
      data = JSON.parse(text);
    } catch {
      /* not JSON */
    }
    return { status: res.status, body: data, headers: res.headers };
  }
  async signIn(email: string, password: string) {
    this.csrf = (await this.req('GET', '/api/auth/csrf')).body.token;
    const r = await this.req('POST', '/api/auth/login', { json: { email, password } });
    if (r.status !== 200)
      throw new Error(`sign-in of ${email} on ${this.base} failed: ${r.status} ${JSON.stringify(r.body)}`);
    this.csrf = (await this.req('GET', '/api/auth/csrf')).body.token;
    return r;
  }
  upload(cruiseId: string, files: { filename: string; data: Buffer | string }[], base?: string) {
    const m = multipart(files);
    return this.req('POST', `/api/cruises/${cruiseId}/uploads`, { body: m.body, contentType: m.contentType, base });
  }
}

// ---------------------------------------------------------------------------------------------
// Child web and worker processes

const children = new Set<ChildProcess>();
process.on('exit', () => {
  for (const c of children) {
    try {
      c.kill('SIGKILL');
    } catch {
      /* gone */
    }
  }
});

export type Child = {
  name: string;
  proc: ChildProcess;
  pid: number;
  output(): string;
  /** Parsed JSON log lines (pino) of the process. */
  logs(): Record<string, unknown>[];
  waitForLog(re: RegExp, timeoutMs?: number): Promise<void>;
  alive(): boolean;
  exited: Promise<number | null>;
  stop(signal?: NodeJS.Signals): Promise<void>;
};

/** Runs a server script under Node with the tsx loader in ONE process (no wrapper), so a signal
 * sent to `pid` reaches the process that does the work. */
export function spawnChild(
  name: string,
  script: 'server/index.ts' | 'server/jobs/worker.ts',
  env: Record<string, string>,
): Child {
  const proc = spawn(process.execPath, ['--import', 'tsx', join(ROOT, script)], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: 'test', LOG_LEVEL: 'info', RUN_WORKER_IN_PROCESS: 'false', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.add(proc);
  let out = '';
  proc.stdout!.on('data', (d: Buffer) => {
    out += d.toString();
  });
  proc.stderr!.on('data', (d: Buffer) => {
    out += d.toString();
  });
  let done = false;
  const exited = new Promise<number | null>((resolve) =>
    proc.on('exit', (code) => {
      done = true;
      children.delete(proc);
      resolve(code);
    }),
  );
  const logs = () =>
    out
      .split('\n')
      .filter((l) => l.startsWith('{'))
      .map((l) => {
        try {
          return JSON.parse(l) as Record<string, unknown>;
        } catch {
          return {};
        }
      });
  return {
    name,
    proc,
    pid: proc.pid!,
    exited,
    output: () => out,
    logs,
    alive: () => !done,
    async waitForLog(re, timeoutMs = 60_000) {
      const end = Date.now() + timeoutMs;
      while (!re.test(out)) {
        if (done) throw new Error(`${name} exited before logging ${re}:\n${out.slice(-3000)}`);
        if (Date.now() > end) throw new Error(`${name} did not log ${re} within ${timeoutMs} ms:\n${out.slice(-3000)}`);
        await sleep(100);
      }
    },
    async stop(signal = 'SIGTERM') {
      if (done) return;
      proc.kill(signal);
      const t = setTimeout(() => {
        if (!done) proc.kill('SIGKILL');
      }, 8000);
      await exited;
      clearTimeout(t);
    },
  };
}

/** Waits until GET url answers (any status below 500 unless `ok` says otherwise). */
export async function waitHttp(url: string, timeoutMs = 60_000, child?: Child) {
  const end = Date.now() + timeoutMs;
  for (;;) {
    try {
      const r = await fetch(url, { signal: AbortSignal.timeout(2000) });
      if (r.status < 500) return;
    } catch {
      /* not yet */
    }
    if (child && !child.alive())
      throw new Error(`${child.name} exited while starting:\n${child.output().slice(-3000)}`);
    if (Date.now() > end)
      throw new Error(
        `${url} did not come up within ${timeoutMs} ms${child ? `:\n${child.output().slice(-3000)}` : ''}`,
      );
    await sleep(200);
  }
}

/** The environment a child web or worker process needs, from the test's settings. */
export function serviceEnv(
  s: {
    DATABASE_URL: string;
    S3_ENDPOINT: string;
    S3_BUCKET: string;
    SMTP_URL: string;
    MAIL_CAPTURE_URL?: string;
    SESSION_SECRET: string;
  },
  extra: Record<string, string> = {},
) {
  return {
    DATABASE_URL: s.DATABASE_URL,
    S3_ENDPOINT: s.S3_ENDPOINT,
    S3_BUCKET: s.S3_BUCKET,
    SMTP_URL: s.SMTP_URL,
    MAIL_CAPTURE_URL: s.MAIL_CAPTURE_URL ?? process.env.MAIL_CAPTURE_URL ?? 'http://127.0.0.1:25269',
    SESSION_SECRET: s.SESSION_SECRET,
    JOB_EXPIRE_SECONDS: '10',
    QUEUE_MAINTENANCE_SECONDS: '1',
    ...extra,
  };
}

// ---------------------------------------------------------------------------------------------
// A private S3 fake that can be stopped and started again on the same port and directory

export async function startOwnS3(bucket: string) {
  const port = await freePort();
  const dir = mkdtempSync(join(tmpdir(), 'sl-own-s3-'));
  let server: { run(): Promise<unknown>; close(): Promise<unknown> } | null = null;
  const start = async () => {
    const s = new S3rver({
      address: '127.0.0.1',
      port,
      silent: true,
      directory: dir,
      configureBuckets: [{ name: bucket, configs: [] }],
    });
    await s.run();
    server = s;
  };
  await start();
  return {
    port,
    dir,
    endpoint: `http://127.0.0.1:${port}`,
    start,
    async stop() {
      if (server) {
        const s = server;
        server = null;
        await s.close();
      }
    },
    async destroy() {
      await this.stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

// ---------------------------------------------------------------------------------------------
// A private PostgreSQL cluster (the server refuses root, so it runs as the `postgres` user)

const PG_BIN = process.env.PG_BIN ?? '/usr/lib/postgresql/15/bin';
const asPg = (cmd: string, args: string[]) => {
  const root = process.getuid?.() === 0;
  return execFileSync(
    root ? 'runuser' : join(PG_BIN, cmd),
    root ? ['-u', 'postgres', '--', join(PG_BIN, cmd), ...args] : args,
    { stdio: ['ignore', 'pipe', 'pipe'], timeout: 90_000 },
  ).toString();
};
export const runAsPostgres = asPg;

export async function startOwnPostgres() {
  const port = await freePort();
  const dir = mkdtempSync(join(tmpdir(), 'sl-own-pg-'));
  const data = join(dir, 'data');
  mkdirSync(data);
  if (process.getuid?.() === 0) {
    const uid = Number(execFileSync('id', ['-u', 'postgres']).toString().trim());
    const gid = Number(execFileSync('id', ['-g', 'postgres']).toString().trim());
    chownSync(dir, uid, gid);
    chownSync(data, uid, gid);
  }
  chmodSync(data, 0o700);
  asPg('initdb', ['-D', data, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8', '--no-sync']);
  const opts = `-p ${port} -c listen_addresses=127.0.0.1 -k ${dir} -c fsync=off -c max_connections=100`;
  const start = () => {
    asPg('pg_ctl', ['-D', data, '-w', '-t', '60', '-l', join(dir, 'server.log'), '-o', opts, 'start']);
  };
  const stop = (mode: 'fast' | 'immediate' = 'fast') => {
    asPg('pg_ctl', ['-D', data, '-m', mode, '-w', 'stop']);
  };
  start();
  return {
    port,
    dir,
    url: (db: string) => `postgres://postgres@127.0.0.1:${port}/${db}`,
    start,
    stop,
    running: () => {
      try {
        asPg('pg_ctl', ['-D', data, 'status']);
        return true;
      } catch {
        return false;
      }
    },
    destroy() {
      try {
        stop('immediate');
      } catch {
        /* already down */
      }
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** A raw 24 Hz descent: 1 dbar/s with ship heave (±1.5 dbar, 8 s period), so pressure reverses. */
export function rawCastCsv(k: number, scans = 100_000): string {
  const lines = [
    `# station: RAW${k + 1}`,
    '# cast: 1',
    `# latitude: ${(-42 - k * 0.1).toFixed(4)}`,
    `# longitude: ${(-25 + k * 0.1).toFixed(4)}`,
    '# time: 2026-04-02T03:00:00Z',
    'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]',
  ];
  for (let i = 0; i < scans; i++) {
    const s = i / 24;
    const p = 3 + s + 1.5 * Math.sin((2 * Math.PI * s) / 8);
    const t = 2 + 18 * Math.exp(-p / 650) + 0.001 * Math.sin(i * 0.7 + k);
    const sal = 34.7 + 0.8 * Math.exp(-p / 450) + 0.0005 * Math.cos(i * 0.3 + k);
    lines.push(`${p.toFixed(3)},${t.toFixed(4)},${sal.toFixed(4)}`);
  }
  return lines.join('\n') + '\n';
}
