import { z } from 'zod';
import { defineRoute, byParam, invalidateMemberships, type RouteSpec } from '../lib/routeTable';
import { HttpError, badRequest, conflict, notFound } from '../lib/errors';
import { Cruise, Invitation, Membership, ROLES, User } from '../models/index';
import { audit } from '../lib/audit';
import { hashToken, newToken } from '../auth/tokens';
import { hashPassword, passwordProblem, verifyPassword } from '../auth/passwords';
import { escapeHtml, MAIL_SUBJECTS, quoted } from '../services/mailer';
import { signIn, userJson } from './auth';
import { takeRateSlots } from '../lib/rateLimit';
import { checkSignInAllowed, recordSignIn } from '../auth/limiter';
import type { AppDeps } from '../lib/deps';

const Role = z.enum(ROLES);
const Invite = z.object({ email: z.string().trim().toLowerCase().pipe(z.string().email().max(320)), role: Role });
const ChangeRole = z.object({ role: Role });
const Accept = z.object({ name: z.string().trim().min(1).max(200).optional(), password: z.string().min(1).max(200) });
const ROLE_WORDS: Record<string, string> = {
  chief_scientist: 'chief scientist',
  technician: 'technician',
  analyst: 'analyst',
  pi: 'principal investigator',
};

/** Locks the cruise row so that role changes and removals of one cruise run one at a time: the
 * count of chief scientists read after it is the true one (two chiefs demoting each other at once
 * cannot leave the cruise with none). */
async function lockCruise(cruiseId: string, transaction: import('sequelize').Transaction) {
  await Cruise.findByPk(cruiseId, { transaction, lock: true, attributes: ['id'] });
}

const byUser = async (req: { params: Record<string, string> }) => req.params.userId;

async function liveInvitation(token: string) {
  const inv = await Invitation.findOne({ where: { tokenHash: hashToken(token) } });
  if (!inv || inv.acceptedAt || inv.expiresAt < new Date())
    throw notFound('This invitation is unknown, used or expired.');
  return inv;
}

export function teamRoutes(deps: AppDeps): RouteSpec[] {
  const { sequelize } = deps.db;
  const { mailer, settings } = deps;
  return [
    defineRoute({
      method: 'get',
      path: '/cruises/:id/members',
      summary: 'Members of a cruise and their roles',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (_req, _res, ctx) => {
        const ms = await Membership.findAll({
          where: { cruiseId: ctx.cruiseId! },
          include: [User],
          order: [['createdAt', 'ASC']],
        });
        return ms.map((m) => {
          const u = (m as Membership & { User: User }).User;
          return { userId: u.id, name: u.name, email: u.email, role: m.role };
        });
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/invitations',
      summary: 'Invitations sent for a cruise',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      handler: async (_req, _res, ctx) => {
        const rows = await Invitation.findAll({ where: { cruiseId: ctx.cruiseId! }, order: [['createdAt', 'DESC']] });
        return rows.map((i) => ({
          id: i.id,
          email: i.email,
          role: i.role,
          createdAt: i.createdAt,
          expiresAt: i.expiresAt,
          acceptedAt: i.acceptedAt,
        }));
      },
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/members',
      changesData: false,
      summary: 'Invite someone by e-mail with a role',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      body: Invite,
      handler: async (req, res, ctx) => {
        const { email, role } = ctx.body;
        const cruise = (await Cruise.findByPk(ctx.cruiseId!))!;
        const existing = await User.findOne({ where: { email } });
        if (existing && (await Membership.findOne({ where: { userId: existing.id, cruiseId: cruise.id } })))
          throw conflict(`${email} is already a member of this cruise.`);
        const token = newToken();
        const inv = await sequelize.transaction(async (transaction) => {
          // Invitations send mail to any address: bounded per cruise and per sender (429 past it).
          await takeRateSlots(
            deps.db,
            [
              {
                bucket: 'invite_cruise',
                key: cruise.id,
                limit: settings.INVITES_PER_CRUISE_PER_HOUR,
                windowMs: 3600_000,
                message: 'This cruise has sent as many invitations as allowed in an hour; try again later.',
              },
              {
                bucket: 'invite_sender',
                key: req.user!.id,
                limit: settings.INVITES_PER_SENDER_PER_HOUR,
                windowMs: 3600_000,
                message: 'You have sent as many invitations as allowed in an hour; try again later.',
              },
            ],
            transaction,
          );
          const i = await Invitation.create(
            {
              cruiseId: cruise.id,
              email,
              role,
              tokenHash: hashToken(token),
              invitedBy: req.user!.id,
              expiresAt: new Date(Date.now() + 14 * 86400_000),
              acceptedAt: null,
            },
            { transaction },
          );
          await audit(
            {
              cruiseId: cruise.id,
              userId: req.user!.id,
              action: 'invite',
              entity: 'invitation',
              entityId: i.id,
              after: { email, role },
            },
            transaction,
          );
          return i;
        });
        const link = `${settings.PUBLIC_URL}/invite/${token}`;
        // No text a user chose goes into the subject; in the body it is quoted plainly.
        await mailer.send({
          to: email,
          subject: MAIL_SUBJECTS.invitation(role),
          text: `${quoted(req.user!.name)} invites you to the cruise ${quoted(cruise.name)} (ship ${quoted(cruise.ship)}) on Sigmaline as ${ROLE_WORDS[role]}.\n\nAccept the invitation here (valid for 14 days):\n${link}\n\nIf you do not know the sender, ignore this message.\n`,
          html: `<p>${escapeHtml(req.user!.name)} invites you to the cruise <b>${escapeHtml(cruise.name)}</b> (${escapeHtml(cruise.ship)}) on Sigmaline as ${ROLE_WORDS[role]}.</p><p><a href="${escapeHtml(link)}">Accept the invitation</a> (valid for 14 days).</p>`,
        });
        res.status(201).json({
          invitation: {
            id: inv.id,
            email,
            role,
            createdAt: inv.createdAt,
            expiresAt: inv.expiresAt,
            acceptedAt: null,
          },
        });
      },
    }),
    defineRoute({
      method: 'patch',
      path: '/cruises/:id/members/:userId',
      changesData: false,
      summary: "Change a member's role",
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      body: ChangeRole,
      handler: async (req, _res, ctx) => {
        const { role } = ctx.body;
        const userId = await byUser(req as never);
        return sequelize
          .transaction(async (transaction) => {
            await lockCruise(ctx.cruiseId!, transaction);
            const m = await Membership.findOne({ where: { cruiseId: ctx.cruiseId!, userId }, transaction, lock: true });
            if (!m) throw notFound('No such member.');
            if (m.role === 'chief_scientist' && role !== 'chief_scientist') {
              const chiefs = await Membership.count({
                where: { cruiseId: ctx.cruiseId!, role: 'chief_scientist' },
                transaction,
              });
              if (chiefs <= 1) throw badRequest('A cruise needs at least one chief scientist.', [], 'last_chief');
            }
            const before = { role: m.role };
            await m.update({ role }, { transaction });
            await audit(
              {
                cruiseId: ctx.cruiseId!,
                userId: req.user!.id,
                action: 'change_role',
                entity: 'membership',
                entityId: userId,
                before,
                after: { role },
              },
              transaction,
            );
            return { userId, role };
          })
          .finally(() => invalidateMemberships(ctx.cruiseId!));
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/cruises/:id/members/:userId',
      changesData: false,
      summary: 'Remove a member',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      handler: async (req, res, ctx) => {
        const userId = await byUser(req as never);
        await sequelize.transaction(async (transaction) => {
          await lockCruise(ctx.cruiseId!, transaction);
          const m = await Membership.findOne({ where: { cruiseId: ctx.cruiseId!, userId }, transaction, lock: true });
          if (!m) throw notFound('No such member.');
          if (
            m.role === 'chief_scientist' &&
            (await Membership.count({ where: { cruiseId: ctx.cruiseId!, role: 'chief_scientist' }, transaction })) <= 1
          ) {
            throw badRequest('A cruise needs at least one chief scientist.', [], 'last_chief');
          }
          await m.destroy({ transaction });
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'remove_member',
              entity: 'membership',
              entityId: userId,
              before: { role: m.role },
            },
            transaction,
          );
        });
        invalidateMemberships(ctx.cruiseId!);
        res.status(204).end();
      },
    }),
    defineRoute({
      method: 'get',
      path: '/invitations/:token',
      summary: 'What an invitation offers',
      rule: { kind: 'public' },
      handler: async (req) => {
        const inv = await liveInvitation(String(req.params.token));
        const [cruise, inviter, account] = await Promise.all([
          Cruise.findByPk(inv.cruiseId),
          User.findByPk(inv.invitedBy),
          User.findOne({ where: { email: inv.email } }),
        ]);
        return {
          email: inv.email,
          role: inv.role,
          cruise: { id: cruise!.id, name: cruise!.name, ship: cruise!.ship },
          invitedBy: inviter?.name ?? '',
          accountExists: Boolean(account?.passwordHash),
        };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/invitations/:token/accept',
      summary: 'Accept an invitation: create the account or add the membership, and sign in',
      rule: { kind: 'public' },
      body: Accept,
      handler: async (req, _res, ctx) => {
        const b = ctx.body;
        const inv = await liveInvitation(String(req.params.token));
        let user = await User.findOne({ where: { email: inv.email } });
        if (user?.passwordHash) {
          // The same back-off as sign-in: this is a password check of an existing account.
          const ip = req.ip ?? '';
          await checkSignInAllowed(inv.email, ip, settings);
          const ok = await verifyPassword(user.passwordHash, b.password);
          if (!ok) {
            await recordSignIn(inv.email, ip, false);
            throw new HttpError(401, 'bad_credentials', `The password is not that of ${inv.email}.`);
          }
        } else {
          const problem = passwordProblem(b.password);
          if (problem) throw badRequest(problem, [{ field: 'password', message: problem }], 'weak_password');
          if (!b.name) throw badRequest('Give your name.', [{ field: 'name', message: 'required' }]);
        }
        const hash = user?.passwordHash ? null : await hashPassword(b.password);
        user = await sequelize.transaction(async (transaction) => {
          let u = user;
          if (!u) u = await User.create({ email: inv.email, name: b.name!, passwordHash: hash }, { transaction });
          else if (hash) await u.update({ passwordHash: hash, name: b.name ?? u.name }, { transaction });
          const fresh = await Invitation.findByPk(inv.id, { transaction, lock: true });
          if (!fresh || fresh.acceptedAt) throw notFound('This invitation is unknown, used or expired.');
          await fresh.update({ acceptedAt: new Date() }, { transaction });
          const m = await Membership.findOne({ where: { userId: u.id, cruiseId: inv.cruiseId }, transaction });
          if (!m) await Membership.create({ userId: u.id, cruiseId: inv.cruiseId, role: inv.role }, { transaction });
          await audit(
            {
              cruiseId: inv.cruiseId,
              userId: u.id,
              action: 'accept_invitation',
              entity: 'membership',
              entityId: u.id,
              after: { role: inv.role },
            },
            transaction,
          );
          return u;
        });
        invalidateMemberships(inv.cruiseId);
        const sessionUser = { id: user.id, email: user.email, name: user.name, isAdmin: user.isAdmin };
        await signIn(req, sessionUser);
        return { user: userJson(sessionUser) };
      },
    }),
  ];
}
