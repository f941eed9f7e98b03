// createApp builds the Express app from its dependencies; server/index.ts only listens.
import express, { type ErrorRequestHandler } from 'express';
import helmet from 'helmet';
import compression from 'compression';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { Pool } from 'pg';
import pg from 'pg';
import { sessionMiddleware, configurePassport, csrfGuard } from './auth/session';
import { warmPasswordCheck } from './auth/passwords';
import { configureCache } from './services/cruiseData';
import { HttpError, errorBody } from './lib/errors';
import { logger } from './lib/logger';
import { mountRoutes, type RouteSpec } from './lib/routeTable';
import { openApiDocument } from './lib/openapi';
import type { AppDeps } from './lib/deps';
import { allRoutes } from './routes/registry';

export { VERSION } from './version';
import { VERSION } from './version';

/** True for errors that mean PostgreSQL could not be reached (down, restarting, connection cut),
 * whether they come from Sequelize, pg-boss or the session store's pg pool. */
export function databaseUnreachable(err: unknown): boolean {
  for (
    let e = err as { name?: string; code?: string; message?: string; parent?: unknown; original?: unknown } | undefined,
      depth = 0;
    e && depth < 4;
    e = (e.parent ?? e.original) as typeof e, depth++
  ) {
    if (
      /^Sequelize(Connection\w*|HostNotReachable|HostNotFound|AccessDenied)Error$|^ConnectionAcquireTimeoutError$/.test(
        e.name ?? '',
      )
    )
      return true;
    if (
      [
        'ECONNREFUSED',
        'ECONNRESET',
        'ETIMEDOUT',
        'EPIPE',
        '57P01',
        '57P02',
        '57P03',
        '08000',
        '08001',
        '08003',
        '08006',
      ].includes(e.code ?? '')
    )
      return true;
    if (
      /Connection terminated|connection to the server|the database system is (starting up|shutting down)/i.test(
        e.message ?? '',
      )
    )
      return true;
  }
  return false;
}

/** The `trust proxy` value of a TRUST_PROXY setting: empty or "false" for none; never "everyone". */
export function trustProxy(setting: string): string | false {
  const v = setting.trim();
  if (v === '' || v === 'false') return false;
  if (v === 'true' || v === '*')
    throw new Error('TRUST_PROXY must name the proxies (e.g. loopback or their addresses), not trust everyone');
  return v;
}

export type App = express.Express & { routes: RouteSpec[]; close: () => Promise<void> };

export function createApp(deps: AppDeps, opts: { staticDir?: string } = {}): App {
  const app = express() as App;
  const settings = deps.settings;
  // X-Forwarded-* headers count only from the proxies named in TRUST_PROXY (none by default), so
  // nobody can pick their own address for the sign-in limits or claim https.
  app.set('trust proxy', trustProxy(settings.TRUST_PROXY));
  warmPasswordCheck();
  configureCache({ maxBytes: settings.SECTION_CACHE_MAX_BYTES });
  app.disable('x-powered-by');
  // gzip for the client's files and JSON answers (the section route sends its own cached gzip)
  app.use(compression({ threshold: 1024 }));
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          frameSrc: ["'self'"],
          objectSrc: ["'none'"],
          workerSrc: ["'self'", 'blob:'],
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );
  // Sessions share the database with the app but get their own small pool.
  const sessionPool: Pool = new pg.Pool({ connectionString: settings.DATABASE_URL, max: 10 });
  sessionPool.on('error', (err) => logger.warn({ err }, 'session pool error'));
  const secure =
    settings.COOKIE_SECURE === 'auto'
      ? settings.PUBLIC_URL.startsWith('https:')
        ? true
        : false
      : settings.COOKIE_SECURE === 'true';
  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(sessionMiddleware(sessionPool, settings.SESSION_SECRET, secure));
  const passport = configurePassport();
  api.use(passport.initialize());
  api.use(passport.session());
  api.use(csrfGuard);

  api.get('/health', async (_req, res) => {
    const parts = { db: 'ok', storage: 'ok', queue: 'ok' } as Record<'db' | 'storage' | 'queue', string>;
    const timeout = <T>(p: Promise<T>) =>
      Promise.race([p, new Promise<never>((_, rej) => setTimeout(() => rej(new Error('timeout')), 3000))]);
    await Promise.all([
      timeout(deps.db.sequelize.query('SELECT 1')).catch(() => {
        parts.db = 'down';
      }),
      timeout(deps.storage.check()).catch(() => {
        parts.storage = 'down';
      }),
      timeout(deps.queue.check()).catch(() => {
        parts.queue = 'down';
      }),
    ]);
    const down = Object.entries(parts)
      .filter(([, v]) => v !== 'ok')
      .map(([k]) => k);
    if (down.length) {
      res.status(503).json({
        status: 'down',
        ...parts,
        error: {
          code: 'unavailable',
          message: `Not available: ${down.join(', ')}`,
          details: down.map((d) => ({ part: d })),
        },
      });
    } else res.json({ status: 'ok', ...parts });
  });

  const routes: RouteSpec[] = allRoutes(deps);
  app.routes = routes;
  api.get('/openapi.json', (_req, res) => {
    res.json(openApiDocument(routes, VERSION));
  });
  mountRoutes(api, routes);
  api.use((_req, res) => {
    res.status(404).json(errorBody('not_found', 'No such API route.'));
  });
  app.use('/api', api);

  const staticDir = opts.staticDir ?? join(process.cwd(), 'dist');
  if (existsSync(join(staticDir, 'index.html'))) {
    app.use(express.static(staticDir, { index: false, maxAge: '1h' }));
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(join(staticDir, 'index.html')));
  }

  const onError: ErrorRequestHandler = (err, req, res, _next) => {
    if (err instanceof HttpError) {
      const retryAfter = (err as HttpError & { retryAfter?: number }).retryAfter;
      if (retryAfter) res.setHeader('retry-after', String(retryAfter));
      res.status(err.status).json(errorBody(err.code, err.message, err.details));
      return;
    }
    const e = err as { type?: string; status?: number; code?: string; message?: string };
    if (e.type === 'entity.parse.failed') {
      res.status(400).json(errorBody('bad_json', 'The request body is not valid JSON.'));
      return;
    }
    if (e.type === 'entity.too.large') {
      res.status(413).json(errorBody('too_large', 'The request body is too large.'));
      return;
    }
    if (e.code === 'LIMIT_FILE_SIZE') {
      res
        .status(413)
        .json(
          errorBody(
            'too_large',
            `A file is larger than the limit of ${Math.round(settings.UPLOAD_MAX_BYTES / 1048576)} MB.`,
          ),
        );
      return;
    }
    if (typeof e.code === 'string' && e.code.startsWith('LIMIT_')) {
      res.status(400).json(errorBody('bad_upload', e.message ?? 'Bad upload.'));
      return;
    }
    if (databaseUnreachable(err)) {
      logger.warn({ err, url: req.url }, 'database unreachable');
      res
        .status(503)
        .json(
          errorBody(
            'db_unavailable',
            'The database is not reachable right now; nothing was changed. Try again shortly.',
          ),
        );
      return;
    }
    logger.error({ err, url: req.url }, 'unhandled error');
    res.status(500).json(errorBody('internal', 'Something went wrong on the server; it has been logged.'));
  };
  app.use(onError);
  app.close = async () => {
    await sessionPool.end();
  };
  return app;
}
