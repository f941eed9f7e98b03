import { z } from 'zod';
import type { Request } from 'express';
import passport from 'passport';
import { QueryTypes } from 'sequelize';
import { defineRoute, type RouteSpec } from '../lib/routeTable';
import { HttpError, badRequest } from '../lib/errors';
import { Membership, PasswordReset, User } from '../models/index';
import { csrfToken } from '../auth/session';
import { hashPassword, passwordProblem, verifyPassword } from '../auth/passwords';
import { checkSignInAllowed, clearSignInFailures, recordSignIn } from '../auth/limiter';
import { endSessionsOf } from '../auth/sessions';
import { takeRateSlots } from '../lib/rateLimit';
import { queueMail } from '../lib/mailQueue';
import { hashToken, newToken } from '../auth/tokens';
import { escapeHtml, MAIL_SUBJECTS } from '../services/mailer';
import type { AppDeps } from '../lib/deps';

const Login = z.object({ email: z.string().email().max(320), password: z.string().min(1).max(200) });
const ResetRequest = z.object({ email: z.string().email().max(320) });
const ResetConfirm = z.object({ token: z.string().min(10).max(200), password: z.string().max(200) });
const ChangePassword = z.object({ currentPassword: z.string().min(1).max(200), password: z.string().max(200) });

export const userJson = (u: { id: string; email: string; name: string; isAdmin: boolean }) => ({
  id: u.id,
  email: u.email,
  name: u.name,
  isAdmin: u.isAdmin,
});

/** Regenerates the session (no fixation) and signs the user in. */
export function signIn(req: Request, user: Express.User): Promise<void> {
  return new Promise((resolve, reject) => {
    req.session.regenerate((err) => {
      if (err) return reject(err);
      req.login(user, (e) => (e ? reject(e) : resolve()));
    });
  });
}

function authenticate(req: Request): Promise<Express.User | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', { session: false }, (err: unknown, user: Express.User | false) =>
      err ? reject(err) : resolve(user),
    )(req);
  });
}

export function authRoutes(deps: AppDeps): RouteSpec[] {
  const { settings, mailer } = deps;
  return [
    defineRoute({
      method: 'get',
      path: '/auth/csrf',
      summary: 'A CSRF token for this session',
      rule: { kind: 'public' },
      handler: (req) => ({ token: csrfToken(req) }),
    }),
    defineRoute({
      method: 'post',
      path: '/auth/login',
      summary: 'Sign in with e-mail and password',
      rule: { kind: 'public' },
      body: Login,
      responses: { 200: 'signed in', 401: 'bad credentials', 429: 'too many failed attempts' },
      handler: async (req, _res, ctx) => {
        const { email } = ctx.body;
        const key = email.trim().toLowerCase();
        const ip = req.ip ?? '';
        // A growing delay per account and address, never a lockout (server/auth/limiter.ts).
        await checkSignInAllowed(key, ip, settings);
        req.body.email = key;
        const user = await authenticate(req);
        await recordSignIn(key, ip, Boolean(user));
        if (!user) throw new HttpError(401, 'bad_credentials', 'E-mail or password is wrong.');
        await signIn(req, user);
        return { user: userJson(user) };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/auth/logout',
      summary: 'Sign out',
      rule: { kind: 'signed_in' },
      handler: async (req, res) => {
        await new Promise<void>((resolve, reject) => req.logout((e) => (e ? reject(e) : resolve())));
        await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
        res.clearCookie('sigmaline.sid');
        res.status(204).end();
      },
    }),
    defineRoute({
      method: 'get',
      path: '/auth/me',
      summary: 'The signed-in user and their roles',
      rule: { kind: 'signed_in' },
      handler: async (req) => {
        const memberships = await Membership.findAll({ where: { userId: req.user!.id } });
        return {
          user: userJson(req.user!),
          memberships: memberships.map((m) => ({ cruiseId: m.cruiseId, role: m.role })),
        };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/auth/password-reset',
      summary: 'E-mail a password-reset link',
      rule: { kind: 'public' },
      body: ResetRequest,
      responses: { 202: 'accepted (whether or not the account exists)' },
      handler: async (_req, res, ctx) => {
        const { email } = ctx.body;
        const key = email.trim().toLowerCase();
        // The same work whatever the address: one rate-limit slot, then the lookup, the token and the
        // mail happen after the answer, from the mail queue (no timing tells an account exists).
        await takeRateSlots(deps.db, [
          {
            bucket: 'reset_mail',
            key,
            limit: settings.RESET_MAILS_PER_ADDRESS_PER_HOUR,
            windowMs: 3600_000,
            message:
              'Enough reset e-mails were sent to this address for now; use the newest one or try again in an hour.',
          },
        ]);
        queueMail(mailer, async () => {
          const user = await User.findOne({ where: { email: key } });
          if (!user) return null;
          const token = newToken();
          await PasswordReset.create({
            userId: user.id,
            tokenHash: hashToken(token),
            expiresAt: new Date(Date.now() + 3600_000),
            usedAt: null,
          });
          const link = `${settings.PUBLIC_URL}/reset/${token}`;
          return {
            to: user.email,
            subject: MAIL_SUBJECTS.reset,
            text: `Someone asked to reset the Sigmaline password of ${user.email}.\n\nSet a new password here (valid for one hour):\n${link}\n\nIf it was not you, ignore this message.`,
            html: `<p>Someone asked to reset the Sigmaline password of ${escapeHtml(user.email)}.</p><p><a href="${escapeHtml(link)}">Set a new password</a> (valid for one hour).</p><p>If it was not you, ignore this message.</p>`,
          };
        });
        res.status(202).json({ ok: true });
      },
    }),
    defineRoute({
      method: 'post',
      path: '/auth/password-reset/confirm',
      summary: 'Set a new password with an e-mailed token; ends every session of the account',
      rule: { kind: 'public' },
      body: ResetConfirm,
      handler: async (req, res, ctx) => {
        const { token, password } = ctx.body;
        const invalid = () => badRequest('This reset link is unknown, used or expired.', [], 'invalid_token');
        const reset = await PasswordReset.findOne({ where: { tokenHash: hashToken(token) } });
        if (!reset || reset.usedAt || reset.expiresAt < new Date()) throw invalid();
        const problem = passwordProblem(password);
        if (problem) throw badRequest(problem, [{ field: 'password', message: problem }], 'weak_password');
        const hash = await hashPassword(password);
        await deps.db.sequelize.transaction(async (transaction) => {
          // Taking the token is one conditional UPDATE: of two concurrent confirms, one wins.
          const taken = (await deps.db.sequelize.query(
            'UPDATE password_resets SET used_at = now(), updated_at = now() WHERE id = :id AND used_at IS NULL AND expires_at > now() RETURNING user_id AS "userId"',
            { replacements: { id: reset.id }, type: QueryTypes.SELECT, transaction },
          )) as { userId: string }[];
          if (!taken.length) throw invalid();
          const user = await User.findByPk(taken[0].userId, { transaction, lock: true });
          if (!user) throw invalid();
          await user.update({ passwordHash: hash }, { transaction });
          // Every session of the account ends (the one asking is not signed in as it, or keeps its own).
          await endSessionsOf(deps.db, user.id, req.user?.id === user.id ? req.sessionID : null, transaction);
          await clearSignInFailures(user.email, transaction);
        });
        res.status(204).end();
      },
    }),
    defineRoute({
      method: 'post',
      path: '/auth/password',
      summary: 'Change your password; ends your other sessions',
      rule: { kind: 'signed_in' },
      body: ChangePassword,
      responses: { 204: 'changed', 401: 'the current password is wrong', 429: 'too many failed attempts' },
      handler: async (req, res, ctx) => {
        const b = ctx.body;
        const me = req.user!;
        const ip = req.ip ?? '';
        await checkSignInAllowed(me.email, ip, settings);
        const user = await User.findByPk(me.id);
        const ok = await verifyPassword(user?.passwordHash ?? null, b.currentPassword);
        if (!user || !ok) {
          await recordSignIn(me.email, ip, false);
          throw new HttpError(401, 'bad_credentials', 'The current password is wrong.');
        }
        const problem = passwordProblem(b.password);
        if (problem) throw badRequest(problem, [{ field: 'password', message: problem }], 'weak_password');
        const hash = await hashPassword(b.password);
        await deps.db.sequelize.transaction(async (transaction) => {
          await user.update({ passwordHash: hash }, { transaction });
          await endSessionsOf(deps.db, user.id, req.sessionID, transaction);
        });
        res.status(204).end();
      },
    }),
  ];
}
