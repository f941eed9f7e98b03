// The one way a data change is made: a transaction that writes, the audit entry written in the same
// transaction (so no change exists without its record, and no record without its change), and,
// once the transaction has committed, the cruise's cached grids dropped so every section, export
// and delivery of this process sees the change at once (other processes within 0.5 s,
// see cruiseData.dataVersion).
import type { Sequelize, Transaction } from 'sequelize';
import { audit } from '../lib/audit';
import { invalidateDataVersion } from './cruiseData';

export type AuditedWrite<T> = {
  /** the answer of the change (returned to the caller) */
  result: T;
  /** the entity the audit entry names; defaults to the cruise */
  entityId?: string | null;
  before?: unknown;
  after?: unknown;
};

/**
 * Runs `write` in a transaction, records `{ action, entity }` with what `write` reports, and drops
 * the cruise's caches after the commit. A throw inside `write` rolls back both the change and its
 * audit entry and leaves the caches alone.
 */
export async function auditedChange<T>(
  sequelize: Sequelize,
  what: { cruiseId: string; userId: string | null; action: string; entity: string },
  write: (transaction: Transaction) => Promise<AuditedWrite<T>>,
): Promise<T> {
  const result = await sequelize.transaction(async (transaction) => {
    const w = await write(transaction);
    await audit(
      {
        cruiseId: what.cruiseId,
        userId: what.userId,
        action: what.action,
        entity: what.entity,
        entityId: w.entityId ?? null,
        before: w.before,
        after: w.after,
      },
      transaction,
    );
    return w.result;
  });
  invalidateDataVersion(what.cruiseId);
  return result;
}
