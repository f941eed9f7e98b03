// Ending sessions: after a password reset or change, every other session of the account ends at
// once (they live in PostgreSQL; see session.ts).
import { QueryTypes, type Transaction } from 'sequelize';
import type { Db } from '../db';

/** Deletes every session of the user except `keepSid` (if given); returns how many ended. */
export async function endSessionsOf(
  db: Db,
  userId: string,
  keepSid: string | null = null,
  transaction?: Transaction,
): Promise<number> {
  const rows = await db.sequelize.query(
    `DELETE FROM "session" WHERE (sess::jsonb #>> '{passport,user,id}' = :id OR sess::jsonb #>> '{passport,user}' = :id)
       AND (CAST(:keep AS text) IS NULL OR sid <> :keep) RETURNING sid`,
    { replacements: { id: userId, keep: keepSid }, type: QueryTypes.SELECT, transaction },
  );
  return rows.length;
}
