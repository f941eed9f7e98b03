// Quality flags of a cast: setting them on a pressure range (by hand or by accepting a proposal), the flag log
// that keeps every change with the flags it replaced, and undo. Whatever depends on the flags is redone in the
// same transaction: the cast's current inversion warnings, and (through the cast's updated time) every cached
// section and table of the cruise.
import type { Transaction } from 'sequelize';
import { Op } from 'sequelize';
import { Cast, CastColumn, User } from '../models/index';
import { FlagChange, QcProposalRow, type PriorFlags } from '../models/qc';
import { readColumns, encodeU8 } from './columns';
import { inversionsOfGoodLevels } from './processCast';
import { invalidateDataVersion } from './cruiseData';
import { audit } from '../lib/audit';
import { badRequest, conflict, notFound } from '../lib/errors';
import type { AppDeps } from '../lib/deps';

export const FLAG_VARIABLES = ['temperature', 'salinity', 'conductivity', 'oxygen', 'all'] as const;
export type FlagVariable = (typeof FLAG_VARIABLES)[number];
const SENSORS = ['temperature', 'salinity', 'conductivity', 'oxygen'] as const;

export interface FlagEditInput {
  variable: FlagVariable;
  pFrom: number;
  pTo: number;
  flag: 1 | 2 | 3 | 4 | 9;
  reason?: string | null;
}

/** Redo what depends on the flags of one cast (its inversion warnings) and touch it. */
async function refreshCast(deps: AppDeps, c: Cast, transaction: Transaction) {
  const all = (await readColumns([c.id])).get(c.id)!;
  const flagRows = await CastColumn.findAll({ where: { castId: c.id, kind: 'flag' }, transaction });
  const flagsNow = Object.fromEntries(flagRows.map((r) => [r.name, new Uint8Array(r.values)]));
  const inversions =
    all.columns.pressure && all.columns.sigma0
      ? inversionsOfGoodLevels(all.columns, flagsNow, deps.settings.INVERSION_THRESHOLD)
      : [];
  c.changed('updatedAt', true);
  await c.update({ inversions, inversionCount: inversions.length, updatedAt: new Date() }, { transaction });
}

/**
 * Set `flag` on every level of the variable(s) whose pressure lies in [pFrom, pTo], in the caller's transaction.
 * Records the change in the flag log (with the flags replaced, per level) and in the audit trail.
 */
export async function applyFlagEdit(
  deps: AppDeps,
  c: Cast,
  edit: FlagEditInput,
  who: { userId: string | null; source: 'manual' | 'proposal'; proposalId?: string | null },
  transaction: Transaction,
): Promise<{ levels: number; change: FlagChange }> {
  if (edit.pTo < edit.pFrom)
    throw badRequest('The range ends above where it starts.', [{ field: 'pTo', message: 'must be ≥ pFrom' }]);
  const p = (await readColumns([c.id], ['pressure'])).get(c.id)!.columns.pressure ?? new Float64Array(0);
  const variables = edit.variable === 'all' ? [...SENSORS] : [edit.variable];
  let changed = 0;
  const before: Record<string, number[]> = {};
  const prior: PriorFlags = {};
  for (const v of variables) {
    const name = `flag:${v}`;
    const row = await CastColumn.findOne({ where: { castId: c.id, name }, transaction, lock: true });
    if (!row && edit.variable === 'all' && v !== 'temperature') continue;
    const flags = row ? new Uint8Array(row.values) : new Uint8Array(p.length).fill(2);
    const replaced: number[] = [];
    let from = -1;
    for (let i = 0; i < p.length; i++) {
      if (p[i] >= edit.pFrom && p[i] <= edit.pTo) {
        if (from < 0) from = i;
        replaced.push(flags[i]);
        flags[i] = edit.flag;
        changed++;
      }
    }
    before[v] = [...new Set(replaced)];
    if (from >= 0) prior[v] = { from, values: replaced, created: !row };
    if (row) await row.update({ values: encodeU8(flags) }, { transaction });
    else
      await CastColumn.create(
        { castId: c.id, name, unit: null, kind: 'flag', values: encodeU8(flags) },
        { transaction },
      );
  }
  await refreshCast(deps, c, transaction);
  const change = await FlagChange.create(
    {
      cruiseId: c.cruiseId,
      castId: c.id,
      userId: who.userId,
      variable: edit.variable,
      pFrom: edit.pFrom,
      pTo: edit.pTo,
      flag: edit.flag,
      levels: changed,
      reason: edit.reason ?? null,
      prior,
      source: who.source,
      proposalId: who.proposalId ?? null,
      undoesId: null,
    },
    { transaction },
  );
  await audit(
    {
      cruiseId: c.cruiseId,
      userId: who.userId,
      action: 'set_flag',
      entity: 'cast',
      entityId: c.id,
      before: { flagsInRange: before },
      after: {
        variable: edit.variable,
        pFrom: edit.pFrom,
        pTo: edit.pTo,
        flag: edit.flag,
        reason: edit.reason ?? null,
        levels: changed,
        change: change.id,
        ...(who.proposalId ? { proposal: who.proposalId } : {}),
      },
    },
    transaction,
  );
  return { levels: changed, change };
}

/** Set a flag on a range of a cast (the flag form), in its own transaction. */
export async function setFlag(
  deps: AppDeps,
  castId: string,
  edit: FlagEditInput,
  userId: string,
): Promise<{ levels: number; changeId: string }> {
  const c = await Cast.findByPk(castId);
  if (!c) throw notFound();
  const r = await deps.db.sequelize.transaction((t) => applyFlagEdit(deps, c, edit, { userId, source: 'manual' }, t));
  invalidateDataVersion(c.cruiseId);
  return { levels: r.levels, changeId: String(r.change.id) };
}

const overlaps = (a: PriorFlags, b: PriorFlags) =>
  Object.entries(a).some(
    ([v, x]) => b[v] && x.from <= b[v].from + b[v].values.length - 1 && b[v].from <= x.from + x.values.length - 1,
  );

/**
 * Undo one change of the flag log: the levels it set get back the flags they had. Refused (409) when a later
 * change still in force touched the same levels of the same variable — undo that one first — or when the change
 * was itself an undo or is already undone. An accepted proposal whose flag is undone becomes pending again.
 */
export async function undoFlagChange(
  deps: AppDeps,
  castId: string,
  changeId: string,
  userId: string,
): Promise<{ levels: number; changeId: string }> {
  const c = await Cast.findByPk(castId);
  if (!c) throw notFound();
  const r = await deps.db.sequelize.transaction(async (transaction) => {
    const ch = await FlagChange.findOne({ where: { id: changeId, castId }, transaction, lock: true });
    if (!ch) throw notFound('No such change in this cast’s flag log.');
    if (ch.source === 'undo') throw conflict('This entry is itself an undo; set the flag again instead.');
    if (ch.undoneById) throw conflict('This change has already been undone.');
    const later = await FlagChange.findAll({
      where: { castId, id: { [Op.gt]: changeId }, undoneById: null, source: { [Op.ne]: 'undo' } },
      transaction,
    });
    const blocking = later.find((l) => overlaps(l.prior, ch.prior));
    if (blocking)
      throw conflict(
        `A later change (#${blocking.id}, ${blocking.pFrom}–${blocking.pTo} dbar) touched the same levels; undo it first.`,
      );
    const replaced: PriorFlags = {};
    let levels = 0;
    for (const [v, prior] of Object.entries(ch.prior)) {
      const row = await CastColumn.findOne({ where: { castId, name: `flag:${v}` }, transaction, lock: true });
      if (!row) continue;
      const flags = new Uint8Array(row.values);
      replaced[v] = {
        from: prior.from,
        values: Array.from(flags.subarray(prior.from, prior.from + prior.values.length)),
        created: false,
      };
      prior.values.forEach((f, k) => {
        flags[prior.from + k] = f;
        levels++;
      });
      await row.update({ values: encodeU8(flags) }, { transaction });
    }
    await refreshCast(deps, c, transaction);
    const undo = await FlagChange.create(
      {
        cruiseId: c.cruiseId,
        castId,
        userId,
        variable: ch.variable,
        pFrom: ch.pFrom,
        pTo: ch.pTo,
        flag: ch.flag,
        levels,
        reason: `undo of #${ch.id}`,
        prior: replaced,
        source: 'undo',
        proposalId: ch.proposalId,
        undoesId: String(ch.id),
      },
      { transaction },
    );
    await ch.update({ undoneById: String(undo.id) }, { transaction });
    if (ch.proposalId)
      await QcProposalRow.update(
        { status: 'pending', decidedBy: null, decidedAt: null, flagChangeId: null },
        { where: { id: ch.proposalId }, transaction },
      );
    await audit(
      {
        cruiseId: c.cruiseId,
        userId,
        action: 'undo_flag',
        entity: 'cast',
        entityId: castId,
        before: { change: String(ch.id), flag: ch.flag },
        after: {
          restored: Object.fromEntries(Object.entries(ch.prior).map(([v, x]) => [v, [...new Set(x.values)]])),
          levels,
          change: String(undo.id),
        },
      },
      transaction,
    );
    return { levels, changeId: String(undo.id) };
  });
  invalidateDataVersion(c.cruiseId);
  return r;
}

export interface FlagLogEntry {
  id: string;
  at: string;
  who: string | null;
  variable: string;
  pFrom: number;
  pTo: number;
  levels: number;
  /** the distinct flags the change replaced, per variable */
  from: Record<string, number[]>;
  /** the flag set, or for an undo the flags it restored */
  to: number | number[];
  reason: string | null;
  source: 'manual' | 'proposal' | 'undo';
  proposalId: string | null;
  undoes: string | null;
  undoneBy: string | null;
  /** can this entry be undone now (not an undo, not undone, no later change over the same levels) */
  undoable: boolean;
}

/** Every flag change of a cast, newest first. */
export async function flagLog(castId: string): Promise<FlagLogEntry[]> {
  const rows = await FlagChange.findAll({ where: { castId }, order: [['id', 'DESC']] });
  const users = await User.findAll({
    where: { id: [...new Set(rows.map((r) => r.userId).filter((x): x is string => !!x))] },
    attributes: ['id', 'name', 'email'],
  });
  const name = new Map(users.map((u) => [u.id, u.name || u.email]));
  const live = rows.filter((r) => !r.undoneById && r.source !== 'undo');
  const byId = new Map(rows.map((r) => [String(r.id), r]));
  const distinct = (prior: PriorFlags) => [...new Set(Object.values(prior).flatMap((x) => x.values))].sort();
  return rows.map((r) => ({
    id: String(r.id),
    at: r.createdAt.toISOString(),
    who: r.userId ? (name.get(r.userId) ?? null) : null,
    variable: r.variable,
    pFrom: r.pFrom,
    pTo: r.pTo,
    levels: r.levels,
    from: Object.fromEntries(Object.entries(r.prior).map(([v, x]) => [v, [...new Set(x.values)].sort()])),
    to: r.source === 'undo' ? distinct(byId.get(String(r.undoesId))?.prior ?? {}) : r.flag,
    reason: r.reason,
    source: r.source,
    proposalId: r.proposalId,
    undoes: r.undoesId ? String(r.undoesId) : null,
    undoneBy: r.undoneById ? String(r.undoneById) : null,
    undoable:
      r.source !== 'undo' &&
      !r.undoneById &&
      !live.some((l) => BigInt(l.id) > BigInt(r.id) && overlaps(l.prior, r.prior)),
  }));
}
