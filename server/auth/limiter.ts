// Sign-in back-off (docs/security.md). Failures are counted in PostgreSQL so every web process
// applies the same rule. No account is ever locked: after a few free failures each further attempt
// must wait a delay that doubles with every failure (capped), measured from the last failure.
//  - per account and address pair: LOGIN_FREE_FAILURES free, then the growing delay;
//  - per account over every address (guessing from many addresses): LOGIN_MAX_FAILURES free, then
//    the same growing delay;
//  - per address over every account: LOGIN_MAX_FAILURES × 10 in the window, then refused until the
//    window moves on (it is the sender's own address that pays).
// The owner signing in from another address is not slowed by someone else's failures until the
// per-account count is reached, and a password reset clears the account's failures.
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { LoginAttempt } from '../models/index';
import { HttpError } from '../lib/errors';
import type { Settings } from '../config';

export const LOGIN_WINDOW_MS = 15 * 60 * 1000;

type Limits = Pick<
  Settings,
  'LOGIN_FREE_FAILURES' | 'LOGIN_MAX_FAILURES' | 'LOGIN_BACKOFF_BASE_MS' | 'LOGIN_BACKOFF_MAX_MS'
>;

/** Milliseconds to wait after the last of `failures` failures, when `free` of them cost nothing. */
export function backoffMs(
  failures: number,
  free: number,
  s: Pick<Limits, 'LOGIN_BACKOFF_BASE_MS' | 'LOGIN_BACKOFF_MAX_MS'>,
): number {
  if (failures < free) return 0;
  return Math.min(s.LOGIN_BACKOFF_MAX_MS, s.LOGIN_BACKOFF_BASE_MS * 2 ** Math.min(30, failures - free));
}

/** Throws 429 (with Retry-After) when this account and address must wait before another attempt. */
export async function checkSignInAllowed(email: string, ip: string, s: Limits): Promise<void> {
  const since = new Date(Date.now() - LOGIN_WINDOW_MS);
  const [row] = (await LoginAttempt.sequelize!.query(
    `SELECT count(*) FILTER (WHERE ip = :ip)::int AS pair, max(at) FILTER (WHERE ip = :ip) AS "pairLast",
            count(*)::int AS account, max(at) AS "accountLast",
            (SELECT count(*)::int FROM login_attempts WHERE ip = :ip AND NOT succeeded AND at >= :since) AS address
       FROM login_attempts WHERE email = :email AND NOT succeeded AND at >= :since`,
    { replacements: { email, ip, since }, type: QueryTypes.SELECT },
  )) as { pair: number; pairLast: Date | null; account: number; accountLast: Date | null; address: number }[];
  const now = Date.now();
  if (row.address >= s.LOGIN_MAX_FAILURES * 10) throw tooMany(LOGIN_WINDOW_MS);
  const waits = [
    row.pairLast ? new Date(row.pairLast).getTime() + backoffMs(row.pair, s.LOGIN_FREE_FAILURES, s) - now : 0,
    row.accountLast ? new Date(row.accountLast).getTime() + backoffMs(row.account, s.LOGIN_MAX_FAILURES, s) - now : 0,
  ];
  const wait = Math.max(...waits);
  if (wait > 0) throw tooMany(wait);
}

function tooMany(waitMs: number) {
  const seconds = Math.max(1, Math.ceil(waitMs / 1000));
  const err = new HttpError(
    429,
    'rate_limited',
    `Too many failed sign-in attempts; try again in ${seconds} s (or reset your password).`,
    [{ retryAfterSeconds: seconds }],
  );
  (err as HttpError & { retryAfter?: number }).retryAfter = seconds;
  return err;
}

export async function recordSignIn(email: string, ip: string, succeeded: boolean): Promise<void> {
  await LoginAttempt.create({ email, ip, succeeded });
  // A success forgives this address's earlier failures on the account.
  if (succeeded) await LoginAttempt.destroy({ where: { email, ip, succeeded: false } });
}

export async function clearSignInFailures(email: string, transaction?: Transaction): Promise<void> {
  await LoginAttempt.destroy({ where: { email, succeeded: { [Op.eq]: false } }, transaction });
}
