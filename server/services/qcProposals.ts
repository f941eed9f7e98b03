// Proposals of the automatic QC tests (shared/qc): computed when a cast is processed, stored, and decided one by
// one or by test by a technician. Accepting sets the proposed flag through the flag log (so it can be undone);
// rejecting keeps the levels as they are. Every decision is audited. What the intake found (its inversions) is
// kept here too, apart from the cast's current inversions, which follow the flags.
import type { Transaction } from 'sequelize';
import { Cast } from '../models/index';
import { QcIntake, QcProposalRow, type ProposalStatus } from '../models/qc';
import { QC_TESTS, qcProfileFromColumns, runQc, type QcProposal, type QcTestId } from '../../shared/qc/index';
import { detectInversions } from '../../shared/remap/inversions';
import { readColumns, type StoredColumn } from './columns';
import { applyFlagEdit, type FlagVariable } from './qcFlags';
import { invalidateDataVersion } from './cruiseData';
import { audit } from '../lib/audit';
import { badRequest, conflict, notFound } from '../lib/errors';
import type { AppDeps } from '../lib/deps';

/** What the intake hands over: the cast ids it stored, in the order of the processed casts. */
type IntakeBatch = {
  cruiseId: string;
  castIds: string[];
  processed: {
    parsed: { metadata: { latitude: number | null; longitude: number | null } };
    out: { columns: StoredColumn[]; inversions: unknown[] };
    /** the proposals, when the compute thread already ran the tests */
    proposals?: QcProposal[];
  }[];
};

const keyOf = (p: { test: string; variable: string; iFrom: number; iTo: number }) =>
  `${p.test}|${p.variable}|${p.iFrom}|${p.iTo}`;

/** The proposals for a cast from its columns (stored names), pure. */
export function proposalsFromColumns(
  columns: Record<string, Float64Array>,
  latitude: number,
  longitude: number,
  threshold: number,
): QcProposal[] {
  if (!columns.pressure || columns.pressure.length === 0) return [];
  return runQc(qcProfileFromColumns(columns, latitude, longitude), { inversionThreshold: threshold });
}

/** Store a cast's proposals: on a re-run, decided ones that are proposed again keep their decision; pending ones are replaced. */
async function storeProposals(castId: string, cruiseId: string, found: QcProposal[], transaction: Transaction) {
  const old = await QcProposalRow.findAll({ where: { castId }, transaction });
  const decided = new Map(old.filter((o) => o.status !== 'pending').map((o) => [keyOf(o), o]));
  await QcProposalRow.destroy({ where: { castId, status: 'pending' }, transaction });
  const rows = found
    .filter((p) => !decided.has(keyOf(p)))
    .map((p) => ({
      cruiseId,
      castId,
      test: p.test,
      variable: p.variable,
      iFrom: p.iFrom,
      iTo: p.iTo,
      pFrom: p.pFrom,
      pTo: p.pTo,
      levels: p.levels,
      flag: p.flag,
      detail: p.detail,
    }));
  if (rows.length) await QcProposalRow.bulkCreate(rows, { transaction });
}

/**
 * The intake's hook (server/services/ingest.ts): for each processed cast, run the automatic tests and store the
 * proposals and the inversions the intake found. A cast already recorded is left alone unless it was reprocessed.
 */
export async function recordQcAtIntake(
  deps: AppDeps,
  batch: IntakeBatch,
  opts: { reprocess: boolean },
  transaction: Transaction,
): Promise<void> {
  for (const [k, castId] of batch.castIds.entries()) {
    const { parsed, out, proposals } = batch.processed[k];
    if (!opts.reprocess && (await QcIntake.findByPk(castId, { transaction }))) continue;
    const found =
      proposals ??
      proposalsFromColumns(
        Object.fromEntries(out.columns.filter((x) => x.kind !== 'flag').map((x) => [x.name, x.values as Float64Array])),
        parsed.metadata.latitude ?? NaN,
        parsed.metadata.longitude ?? NaN,
        deps.settings.INVERSION_THRESHOLD,
      );
    await storeProposals(castId, batch.cruiseId, found, transaction);
    await QcIntake.upsert({ castId, cruiseId: batch.cruiseId, inversions: out.inversions }, { transaction });
  }
}

/** For a cast stored before the QC desk existed: compute its proposals now (intake inversions from all levels). */
async function ensureRecorded(deps: AppDeps, c: Cast): Promise<QcIntake> {
  const have = await QcIntake.findByPk(c.id);
  if (have) return have;
  const cols = (await readColumns([c.id])).get(c.id)!.columns;
  await deps.db.sequelize.transaction(async (transaction) => {
    await storeProposals(
      c.id,
      c.cruiseId,
      proposalsFromColumns(cols, c.latitude, c.longitude, deps.settings.INVERSION_THRESHOLD),
      transaction,
    );
    const inversions =
      cols.pressure && cols.sigma0
        ? detectInversions(cols.pressure, cols.sigma0, { threshold: deps.settings.INVERSION_THRESHOLD, z: cols.z })
        : [];
    await QcIntake.upsert({ castId: c.id, cruiseId: c.cruiseId, inversions }, { transaction });
  });
  return (await QcIntake.findByPk(c.id))!;
}

export interface ProposalView {
  id: string;
  test: QcTestId;
  variable: FlagVariable;
  iFrom: number;
  iTo: number;
  pFrom: number;
  pTo: number;
  levels: number;
  flag: number;
  detail: string;
  status: ProposalStatus;
  decidedAt: string | null;
  /** the flag-log entry an accepted proposal made (undo it there to reopen the proposal) */
  flagChangeId: string | null;
}

const view = (r: QcProposalRow): ProposalView => ({
  id: r.id,
  test: r.test as QcTestId,
  variable: r.variable as FlagVariable,
  iFrom: r.iFrom,
  iTo: r.iTo,
  pFrom: r.pFrom,
  pTo: r.pTo,
  levels: r.levels,
  flag: r.flag,
  detail: r.detail,
  status: r.status,
  decidedAt: r.decidedAt ? r.decidedAt.toISOString() : null,
  flagChangeId: r.flagChangeId ? String(r.flagChangeId) : null,
});

/** A cast's proposals (by test, then depth) and the inversions its intake found. */
export async function qcOfCast(
  deps: AppDeps,
  castId: string,
): Promise<{ proposals: ProposalView[]; intakeInversions: unknown[] }> {
  const c = await Cast.findByPk(castId);
  if (!c) throw notFound();
  const intake = await ensureRecorded(deps, c);
  const rows = await QcProposalRow.findAll({
    where: { castId },
    order: [
      ['pFrom', 'ASC'],
      ['test', 'ASC'],
    ],
  });
  const order = (t: string) => QC_TESTS.indexOf(t as QcTestId);
  return {
    proposals: rows.map(view).sort((a, b) => order(a.test) - order(b.test) || a.pFrom - b.pFrom),
    intakeInversions: intake.inversions,
  };
}

/** Pending proposals per cast of a cruise (casts without any are left out). */
export async function pendingOfCruise(cruiseId: string): Promise<{ castId: string; pending: number }[]> {
  const rows = (await QcProposalRow.count({
    where: { cruiseId, status: 'pending' },
    group: ['castId'],
  })) as unknown as { castId: string; count: number }[];
  return rows.map((r) => ({ castId: r.castId, pending: Number(r.count) }));
}

/**
 * Accept or reject pending proposals of a cast, chosen by id or all of one test. Accepting sets each proposed
 * flag on its pressure range (a flag-log entry each); all in one transaction; each decision audited.
 */
export async function decideProposals(
  deps: AppDeps,
  castId: string,
  choice: { ids?: string[]; test?: QcTestId; decision: 'accept' | 'reject'; reason?: string },
  userId: string,
): Promise<{ decided: number; levels: number }> {
  const c = await Cast.findByPk(castId);
  if (!c) throw notFound();
  if (!choice.ids?.length && !choice.test)
    throw badRequest('Say which proposals: their ids, or a test.', [
      { field: 'ids', message: 'ids or test is required' },
    ]);
  const where: Record<string, unknown> = { castId, status: 'pending' };
  if (choice.ids?.length) where.id = choice.ids;
  if (choice.test) where.test = choice.test;
  const r = await deps.db.sequelize.transaction(async (transaction) => {
    const rows = await QcProposalRow.findAll({ where, transaction, lock: true, order: [['pFrom', 'ASC']] });
    if (choice.ids?.length && rows.length !== new Set(choice.ids).size) {
      throw badRequest('Some of these proposals are not pending on this cast (decided already, or not this cast’s).', [
        { field: 'ids', message: 'not pending' },
      ]);
    }
    let levels = 0;
    for (const row of rows) {
      let changeId: string | null = null;
      if (choice.decision === 'accept') {
        const reason = choice.reason?.trim() || `accepted proposal: ${row.test.replace(/_/g, ' ')} — ${row.detail}`;
        const out = await applyFlagEdit(
          deps,
          c,
          {
            variable: row.variable as FlagVariable,
            pFrom: row.pFrom,
            pTo: row.pTo,
            flag: row.flag as 3 | 4,
            reason: reason.slice(0, 500),
          },
          { userId, source: 'proposal', proposalId: row.id },
          transaction,
        );
        levels += out.levels;
        changeId = String(out.change.id);
      }
      await row.update(
        {
          status: choice.decision === 'accept' ? 'accepted' : 'rejected',
          decidedBy: userId,
          decidedAt: new Date(),
          flagChangeId: changeId,
        },
        { transaction },
      );
      await audit(
        {
          cruiseId: c.cruiseId,
          userId,
          action: choice.decision === 'accept' ? 'qc_accept' : 'qc_reject',
          entity: 'qc_proposal',
          entityId: row.id,
          before: { status: 'pending' },
          after: {
            status: row.status,
            test: row.test,
            variable: row.variable,
            pFrom: row.pFrom,
            pTo: row.pTo,
            flag: row.flag,
            cast: castId,
            ...(choice.reason ? { reason: choice.reason } : {}),
          },
        },
        transaction,
      );
    }
    return { decided: rows.length, levels };
  });
  if (choice.decision === 'accept' && r.decided) invalidateDataVersion(c.cruiseId);
  return r;
}

/**
 * Reopen rejected proposals of a cast (by id or all rejected ones of a test): they are pending again, nothing else
 * changes (a rejection set no flag). Each reopening is audited (`qc_reopen`, with the decision it takes back).
 * Accepted proposals are reopened by undoing their flag in the flag log (409 names the entry).
 */
export async function reopenProposals(
  deps: AppDeps,
  castId: string,
  choice: { ids?: string[]; test?: QcTestId; reason?: string },
  userId: string,
): Promise<{ reopened: number }> {
  const c = await Cast.findByPk(castId);
  if (!c) throw notFound();
  if (!choice.ids?.length && !choice.test)
    throw badRequest('Say which proposals: their ids, or a test.', [
      { field: 'ids', message: 'ids or test is required' },
    ]);
  return deps.db.sequelize.transaction(async (transaction) => {
    const where: Record<string, unknown> = { castId };
    if (choice.ids?.length) where.id = choice.ids;
    if (choice.test) where.test = choice.test;
    const rows = await QcProposalRow.findAll({ where, transaction, lock: true, order: [['pFrom', 'ASC']] });
    if (choice.ids?.length) {
      if (rows.length !== new Set(choice.ids).size)
        throw badRequest('Some of these proposals are not this cast’s.', [{ field: 'ids', message: 'not found' }]);
      const accepted = rows.find((r) => r.status === 'accepted');
      if (accepted)
        throw conflict(
          `An accepted proposal is reopened by undoing its flag in the flag log (entry #${accepted.flagChangeId}).`,
        );
      if (rows.some((r) => r.status !== 'rejected'))
        throw badRequest('Some of these proposals are pending already.', [{ field: 'ids', message: 'not rejected' }]);
    }
    const rejected = rows.filter((r) => r.status === 'rejected');
    for (const row of rejected) {
      const before = {
        status: 'rejected',
        decidedBy: row.decidedBy,
        decidedAt: row.decidedAt ? row.decidedAt.toISOString() : null,
      };
      await row.update({ status: 'pending', decidedBy: null, decidedAt: null, flagChangeId: null }, { transaction });
      await audit(
        {
          cruiseId: c.cruiseId,
          userId,
          action: 'qc_reopen',
          entity: 'qc_proposal',
          entityId: row.id,
          before,
          after: {
            status: 'pending',
            test: row.test,
            variable: row.variable,
            pFrom: row.pFrom,
            pTo: row.pTo,
            flag: row.flag,
            cast: castId,
            ...(choice.reason ? { reason: choice.reason } : {}),
          },
        },
        transaction,
      );
    }
    return { reopened: rejected.length };
  });
}
