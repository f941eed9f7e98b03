import { z } from 'zod';
import type { Request } from 'express';
import passport from 'passport';
import { Op } from 'sequelize';
import { defineRoute, type RouteSpec } from '../lib/routeTable';
import { HttpError, badRequest } from '../lib/errors';
import { LoginAttempt, Membership, PasswordReset, User } from '../models/index';
import { csrfToken } from '../auth/session';
import { hashPassword, passwordProblem } from '../auth/passwords';
import { hashToken, newToken } from '../auth/tokens';
import { escapeHtml } from '../services/mailer';
import type { AppDeps } from '../lib/deps';

const Login = z.object({ email: z.string().email().max(320), password: z.string().min(1).max(200) });
const ResetRequest = z.object({ email: z.string().email().max(320) });
const ResetConfirm = z.object({ token: z.string().min(10).max(200), password: z.string().max(200) });

export const userJson = (u: { id: string; email: string; name: string; isAdmin: boolean }) => ({ id: u.id, email: u.email, name: u.name, isAdmin: u.isAdmin });

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
    passport.authenticate('local', { session: false }, (err: unknown, user: Express.User | false) => (err ? reject(err) : resolve(user)))(req);
  });
}

export function authRoutes(deps: AppDeps): RouteSpec[] {
  const { settings, mailer } = deps;
  const windowMs = 15 * 60 * 1000;
  return [
    defineRoute({ method: 'get', path: '/auth/csrf', summary: 'A CSRF token for this session', rule: { kind: 'public' },
      handler: (req) => ({ token: csrfToken(req) }) }),
    defineRoute({ method: 'post', path: '/auth/login', summary: 'Sign in with e-mail and password', rule: { kind: 'public' }, body: Login,
      responses: { 200: 'signed in', 401: 'bad credentials', 429: 'too many failed attempts' },
      handler: async (req, _res, ctx) => {
        const { email } = ctx.body as z.infer<typeof Login>;
        const key = email.trim().toLowerCase();
        const since = new Date(Date.now() - windowMs);
        // Failures are counted in PostgreSQL so the limit holds across every web process.
        // Per account, and a looser bound per address (a ship's network shares one address).
        const [byEmail, byIp] = await Promise.all([
          LoginAttempt.count({ where: { email: key, succeeded: false, at: { [Op.gte]: since } } }),
          LoginAttempt.count({ where: { ip: req.ip ?? '', succeeded: false, at: { [Op.gte]: since } } }),
        ]);
        if (byEmail >= settings.LOGIN_MAX_FAILURES || byIp >= settings.LOGIN_MAX_FAILURES * 10) throw new HttpError(429, 'rate_limited', 'Too many failed sign-in attempts; wait 15 minutes or reset your password.');
        req.body.email = key;
        const user = await authenticate(req);
        await LoginAttempt.create({ email: key, ip: req.ip ?? '', succeeded: Boolean(user) });
        if (!user) throw new HttpError(401, 'bad_credentials', 'E-mail or password is wrong.');
        await signIn(req, user);
        return { user: userJson(user) };
      } }),
    defineRoute({ method: 'post', path: '/auth/logout', summary: 'Sign out', rule: { kind: 'signed_in' },
      handler: async (req, res) => {
        await new Promise<void>((resolve, reject) => req.logout((e) => (e ? reject(e) : resolve())));
        await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
        res.clearCookie('sigmaline.sid');
        res.status(204).end();
      } }),
    defineRoute({ method: 'get', path: '/auth/me', summary: 'The signed-in user and their roles', rule: { kind: 'signed_in' },
      handler: async (req) => {
        const memberships = await Membership.findAll({ where: { userId: req.user!.id } });
        return { user: userJson(req.user!), memberships: memberships.map((m) => ({ cruiseId: m.cruiseId, role: m.role })) };
      } }),
    defineRoute({ method: 'post', path: '/auth/password-reset', summary: 'E-mail a password-reset link', rule: { kind: 'public' }, body: ResetRequest,
      responses: { 202: 'accepted (whether or not the account exists)' },
      handler: async (_req, res, ctx) => {
        const { email } = ctx.body as z.infer<typeof ResetRequest>;
        const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
        if (user) {
          const token = newToken();
          await PasswordReset.create({ userId: user.id, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + 3600_000), usedAt: null });
          const link = `${settings.PUBLIC_URL}/reset/${token}`;
          await mailer.send({ to: user.email, subject: 'Sigmaline: reset your password',
            text: `Someone asked to reset the Sigmaline password of ${user.email}.\n\nSet a new password here (valid for one hour):\n${link}\n\nIf it was not you, ignore this message.`,
            html: `<p>Someone asked to reset the Sigmaline password of ${escapeHtml(user.email)}.</p><p><a href="${escapeHtml(link)}">Set a new password</a> (valid for one hour).</p><p>If it was not you, ignore this message.</p>` });
        }
        res.status(202).json({ ok: true });
      } }),
    defineRoute({ method: 'post', path: '/auth/password-reset/confirm', summary: 'Set a new password with an e-mailed token', rule: { kind: 'public' }, body: ResetConfirm,
      handler: async (_req, res, ctx) => {
        const { token, password } = ctx.body as z.infer<typeof ResetConfirm>;
        const reset = await PasswordReset.findOne({ where: { tokenHash: hashToken(token) } });
        if (!reset || reset.usedAt || reset.expiresAt < new Date()) throw badRequest('This reset link is unknown, used or expired.', [], 'invalid_token');
        const problem = passwordProblem(password);
        if (problem) throw badRequest(problem, [{ field: 'password', message: problem }], 'weak_password');
        const user = await User.findByPk(reset.userId);
        if (!user) throw badRequest('This reset link is unknown, used or expired.', [], 'invalid_token');
        const hash = await hashPassword(password);
        await deps.db.sequelize.transaction(async (transaction) => {
          await user.update({ passwordHash: hash }, { transaction });
          await reset.update({ usedAt: new Date() }, { transaction });
          await LoginAttempt.destroy({ where: { email: user.email }, transaction });
        });
        res.status(204).end();
      } }),
  ];
}
