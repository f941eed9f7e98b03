// Rate limits on what sends mail (docs/security.md): counted in PostgreSQL (table rate_events) so
// every web process applies them, under an advisory lock per bucket and key so concurrent requests
// cannot both take the last slot.
import { QueryTypes, type Transaction } from 'sequelize';
import { HttpError } from './errors';
import type { Db } from '../db';

export type RateRule = { bucket: string; key: string; limit: number; windowMs: number; message: string };

/** Takes one slot of every rule, or none: throws 429 naming the first rule that is full. */
export async function takeRateSlots(db: Db, rules: RateRule[], transaction?: Transaction): Promise<void> {
  const run = async (t: Transaction) => {
    for (const r of rules) {
      await db.sequelize.query('SELECT pg_advisory_xact_lock(hashtext(:k))', {
        replacements: { k: `${r.bucket}:${r.key}` },
        transaction: t,
      });
    }
    for (const r of rules) {
      const [row] = (await db.sequelize.query(
        'SELECT count(*)::int AS n, min(at) AS first FROM rate_events WHERE bucket = :b AND key = :k AND at > :since',
        {
          replacements: { b: r.bucket, k: r.key, since: new Date(Date.now() - r.windowMs) },
          type: QueryTypes.SELECT,
          transaction: t,
        },
      )) as { n: number; first: Date | null }[];
      if (row.n >= r.limit) {
        const seconds = Math.max(
          1,
          Math.ceil(((row.first ? new Date(row.first).getTime() : Date.now()) + r.windowMs - Date.now()) / 1000),
        );
        const err = new HttpError(429, 'rate_limited', r.message, [
          { limit: r.limit, windowSeconds: r.windowMs / 1000, retryAfterSeconds: seconds },
        ]);
        (err as HttpError & { retryAfter?: number }).retryAfter = seconds;
        throw err;
      }
    }
    for (const r of rules) {
      await db.sequelize.query('INSERT INTO rate_events (bucket, key, at) VALUES (:b, :k, now())', {
        replacements: { b: r.bucket, k: r.key },
        transaction: t,
      });
    }
  };
  if (transaction) await run(transaction);
  else await db.sequelize.transaction(run);
}
