import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Pool } from 'pg';
import type { RequestHandler } from 'express';
import { User } from '../models/index';
import { verifyPassword } from './passwords';
import { newToken, safeEqual } from './tokens';
import { errorBody } from '../lib/errors';

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
  }
}
declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface User {
      id: string;
      email: string;
      name: string;
      isAdmin: boolean;
    }
  }
}

/** Sessions live in PostgreSQL so that any web process can serve any request. */
export function sessionMiddleware(pool: Pool, secret: string, secure: boolean | 'auto'): RequestHandler {
  const PgStore = connectPgSimple(session);
  return session({
    // no touch: a session lives 12 h from sign-in (no write per request), then signs out
    store: new PgStore({
      pool,
      tableName: 'session',
      createTableIfMissing: false,
      pruneSessionInterval: 600,
      disableTouch: true,
    }),
    name: 'sigmaline.sid',
    secret,
    resave: false,
    saveUninitialized: false,
    rolling: false,
    proxy: undefined, // X-Forwarded-Proto counts only from the proxies of the app's `trust proxy` (TRUST_PROXY)
    cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: 1000 * 60 * 60 * 12 },
  });
}

export function configurePassport() {
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      User.findOne({ where: { email: email.trim().toLowerCase() } })
        .then(async (user) => {
          const ok = await verifyPassword(user?.passwordHash ?? null, password);
          if (!user || !ok) return done(null, false);
          done(null, { id: user.id, email: user.email, name: user.name, isAdmin: user.isAdmin });
        })
        .catch(done);
    }),
  );
  // The session keeps the user's id, e-mail, name and admin bit, so a request costs no user
  // lookup; membership and role are still checked in the database on every cruise route.
  passport.serializeUser((user, done) =>
    done(null, { id: user.id, email: user.email, name: user.name, isAdmin: user.isAdmin }),
  );
  passport.deserializeUser((stored: unknown, done) => {
    if (stored && typeof stored === 'object' && 'id' in stored) {
      const u = stored as Express.User;
      return done(null, { id: u.id, email: u.email, name: u.name, isAdmin: Boolean(u.isAdmin) });
    }
    // sessions made before the user was kept in them hold the id alone
    User.findByPk(String(stored))
      .then((u) => done(null, u ? { id: u.id, email: u.email, name: u.name, isAdmin: u.isAdmin } : false))
      .catch(done);
  });
  return passport;
}

/** The synchronizer token: GET /api/auth/csrf puts a token in the session; every state-changing
 * request must echo it in `x-csrf-token`. */
export function csrfToken(req: Parameters<RequestHandler>[0]): string {
  if (!req.session.csrfToken) req.session.csrfToken = newToken();
  return req.session.csrfToken;
}

export const csrfGuard: RequestHandler = (req, res, next) => {
  if (req.method === 'GET' || req.method === 'HEAD' || req.method === 'OPTIONS') return next();
  const sent = req.get('x-csrf-token');
  const expected = req.session?.csrfToken;
  if (!sent || !expected || !safeEqual(sent, expected)) {
    res.status(403).json(errorBody('csrf', 'Missing or wrong x-csrf-token header; fetch one from GET /api/auth/csrf.'));
    return;
  }
  next();
};
