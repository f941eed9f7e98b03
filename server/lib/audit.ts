import type { Transaction } from 'sequelize';
import { AuditEntry } from '../models/index';

/** Records who changed what, with the value before and after. */
export async function audit(
  entry: {
    cruiseId: string | null;
    userId: string | null;
    action: string;
    entity: string;
    entityId: string | null;
    before?: unknown;
    after?: unknown;
  },
  transaction?: Transaction,
) {
  await AuditEntry.create({ ...entry, before: entry.before ?? null, after: entry.after ?? null }, { transaction });
}
