import { useCallback, useMemo, useState } from 'react';
import { Navigate, useLocation, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { ErrorNotice, Progress } from '../components/Notice';
import { EmptyState, Panel } from '../components/Panel';
import { sigmaLabel } from '../components/plot/theme';
import { useCasts } from '../features/casts';
import {
  CastMeta,
  CastStepper,
  derivedPanels,
  FitnessTable,
  FlagForm,
  FlagLog,
  CastHistoryPanel,
  InversionTable,
  inversionHandling,
  inversionsAt,
  measuredPanels,
  NEIGHBOUR_STYLE,
  ProfileFigure,
  PROPOSAL_COLOR,
  ProposalList,
  REFERENCE_PRESSURES,
  sigmaProfile,
  TsPanel,
  useCast,
  useCastQc,
  useDecideProposals,
  useFlagLog,
  useNeighbours,
  usePendingProposals,
  useQcKeys,
  useUndoFlagChange,
  useReopenProposals,
  overlayCasts,
  earlierDate,
  type CastDetail,
  type EarlierOccupation,
  type CastInversion,
  type Decision,
  type Pick,
  type Proposal,
} from '../features/castsheet';
import type { CastSummary } from '../features/casts';
import { LinePicker } from '../features/lines';
import { isApiError } from '../lib/http';
import { INVERSION_THRESHOLD } from '../features/castsheet';
import { useCurrentCruise } from './CruiseLayout';

/** `/cruises/:id/casts` opens the first cast in track order. */
function FirstCast({ cruiseId }: { cruiseId: string }) {
  const casts = useCasts(cruiseId);
  if (casts.isPending) return <Progress label="Loading the casts…" />;
  if (casts.isError) return <ErrorNotice error={casts.error} title="The casts could not be loaded" />;
  if (casts.data.length === 0) {
    return (
      <Panel title="Casts">
        <EmptyState title="No casts yet">
          Casts appear as files come through intake; each opens here as a cast sheet.
        </EmptyState>
      </Panel>
    );
  }
  return (
    <Navigate replace to={`/cruises/${encodeURIComponent(cruiseId)}/casts/${encodeURIComponent(casts.data[0].id)}`} />
  );
}

export default function CastSheet() {
  const cruise = useCurrentCruise();
  const { castId } = useParams();
  if (!castId) return <FirstCast cruiseId={cruise.id} />;
  return <CastSheetOf key={castId} castId={castId} />;
}

function CastSheetOf({ castId }: { castId: string }) {
  const cruise = useCurrentCruise();
  const cast = useCast(castId);
  const casts = useCasts(cruise.id);
  const location = useLocation();

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-lg font-semibold text-ink-strong">
          {cast.data ? (
            <>
              Station <span className="font-mono">{cast.data.station}</span>{' '}
              <span className="font-normal text-ink-muted">·</span> cast{' '}
              <span className="font-mono">{cast.data.cast}</span>
            </>
          ) : (
            'Cast sheet'
          )}
        </h2>
        {casts.data && <CastStepper cruiseId={cruise.id} castId={castId} casts={casts.data} search={location.search} />}
      </div>
      {cast.isPending && <Progress label="Loading the cast…" />}
      {cast.isError &&
        (isApiError(cast.error, 404) ? (
          <EmptyState title="No such cast">It may have been removed, or the link is from another cruise.</EmptyState>
        ) : (
          <ErrorNotice error={cast.error} title="The cast could not be loaded" />
        ))}
      {cast.isSuccess && <CastBody cast={cast.data} casts={casts.data ?? []} />}
    </div>
  );
}

type Picked = Pick & { at: number };

function Legend({ earlier }: { earlier: EarlierOccupation | null }) {
  return (
    <p className="flex flex-wrap gap-x-4 gap-y-1 border-t border-paper-rule px-4 py-1.5 text-2xs text-ink-muted">
      <span className="inline-flex items-center gap-1">
        <span className="inline-block h-2.5 w-3 border border-warn bg-warn-wash" aria-hidden /> inversion
      </span>
      <span className="inline-flex items-center gap-1">
        <span
          className="inline-block h-2.5 w-3 border border-dotted"
          style={{ borderColor: PROPOSAL_COLOR, background: 'rgba(107,79,143,0.14)' }}
          aria-hidden
        />{' '}
        pending proposal
      </span>
      <span className="inline-flex items-center gap-1">
        <span className="inline-block size-2 rounded-full border border-[#8a6d1f]" aria-hidden /> flag 3
      </span>
      <span className="inline-flex items-center gap-1">
        <span className="font-mono text-warn-strong" aria-hidden>
          ×
        </span>{' '}
        flag 4
      </span>
      <span className="inline-flex items-center gap-1">
        <span
          className="inline-block w-4 border-t border-dashed"
          style={{ borderColor: NEIGHBOUR_STYLE.previous.color }}
          aria-hidden
        />{' '}
        previous station
      </span>
      <span className="inline-flex items-center gap-1">
        <span
          className="inline-block w-4 border-t border-dotted"
          style={{ borderColor: NEIGHBOUR_STYLE.next.color }}
          aria-hidden
        />{' '}
        next station
      </span>
      {earlier?.partner && (
        <span className="inline-flex items-center gap-1" data-testid="legend-earlier">
          <span
            className="inline-block w-5 border-t-2"
            style={{ borderColor: NEIGHBOUR_STYLE.earlier.color, borderStyle: 'dashed' }}
            aria-hidden
          />{' '}
          same station in {earlier.cruise} ({earlierDate(earlier)}, {earlier.partner.station})
        </span>
      )}
    </p>
  );
}

/** Which earlier occupation is overlaid: the newest with a partner, unless the user chose another (or none). */
function EarlierChooser({
  earlier,
  value,
  onChange,
}: {
  earlier: readonly EarlierOccupation[];
  value: string;
  onChange: (v: string) => void;
}) {
  if (earlier.length === 0) return null;
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="font-semibold text-ink-soft">Earlier occupation</span>
      <select
        aria-label="Earlier occupation"
        data-testid="earlier-picker"
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className="h-8 rounded border border-ink/40 bg-paper-raised px-2 text-sm text-ink"
      >
        {earlier.map((e) => (
          <option key={e.cruiseId} value={e.cruiseId} disabled={!e.partner}>
            {e.cruise} · {earlierDate(e)}
            {e.partner ? ` · ${e.partner.station}` : ' · no partner'}
          </option>
        ))}
        <option value="none">None</option>
      </select>
    </label>
  );
}

function CastBody({ cast, casts }: { cast: CastDetail; casts: readonly CastSummary[] }) {
  const cruise = useCurrentCruise();
  const navigate = useNavigate();
  const location = useLocation();
  const [search, setSearch] = useSearchParams();
  const refParam = Number(search.get('ref') ?? 0);
  const ref = (REFERENCE_PRESSURES as readonly number[]).includes(refParam) ? refParam : 0;
  const [picking, setPicking] = useState(false);
  const [picked, setPicked] = useState<Picked | null>(null);
  const [range, setRange] = useState<{ pFrom: number; pTo: number } | null>(null);
  const [currentId, setCurrentId] = useState<string | null>(null);
  // neighbouring stations differ most in the upper ocean; a window there makes the overlay readable
  const [upper, setUpper] = useState(false);
  const pWindow = useMemo<[number, number] | null>(() => (upper ? [0, 1500] : null), [upper]);
  const mayFlag = (cruise.role === 'technician' || cruise.role === 'chief_scientist') && !cruise.locked;

  // the neighbours follow the line the user chose (here, or on the section screen: ?line=<id>); else the default line
  const lineParam = search.get('line');
  const line = lineParam && /^[0-9a-f-]{36}$/i.test(lineParam) ? lineParam : null;
  const setLine = (id: string | null) => {
    const next = new URLSearchParams(search);
    if (id) next.set('line', id);
    else next.delete('line');
    setSearch(next, { replace: true });
  };
  // which earlier occupation is overlaid (?then=<cruise id> or none), kept while stepping between casts
  const earlierChoice = search.get('then');
  const setEarlierChoice = (v: string) => {
    const next = new URLSearchParams(search);
    next.set('then', v);
    setSearch(next, { replace: true });
  };

  const qc = useCastQc(cast.id);
  const log = useFlagLog(cast.id);
  const neighboursQ = useNeighbours(cast.id, line);
  const pendingQ = usePendingProposals(cruise.id);
  const decide = useDecideProposals(cruise.id, cast.id);
  const reopen = useReopenProposals(cruise.id, cast.id);
  const undo = useUndoFlagChange(cruise.id, cast.id);
  const earlierList = useMemo(() => neighboursQ.data?.earlier ?? [], [neighboursQ.data]);
  const earlierId =
    (earlierChoice && (earlierChoice === 'none' || earlierList.some((e) => e.cruiseId === earlierChoice))
      ? earlierChoice
      : null) ??
    earlierList.find((e) => e.partner)?.cruiseId ??
    'none';
  const earlier = earlierList.find((e) => e.cruiseId === earlierId && e.partner) ?? null;
  const neighbours = useMemo(
    () => overlayCasts(neighboursQ.data?.neighbours ?? [], earlier),
    [neighboursQ.data, earlier],
  );
  const proposals = useMemo(() => qc.data?.proposals ?? [], [qc.data]);

  const sigma = useMemo(() => sigmaProfile(cast.columns.SA, cast.columns.CT, ref), [cast, ref]);
  const inversionSet = useMemo(() => inversionsAt(cast, ref, sigma), [cast, ref, sigma]);
  const measured = useMemo(() => measuredPanels(cast, neighbours), [cast, neighbours]);
  const derived = useMemo(() => derivedPanels(cast, sigma, ref, neighbours), [cast, sigma, ref, neighbours]);
  // At σ0 the table lists what the intake found, each with how it is handled now.
  const intake = ref === 0 && qc.data ? qc.data.intakeInversions : null;
  const handling = useMemo(
    () => (intake ? inversionHandling(intake, cast.inversions, cast.flags, proposals) : null),
    [intake, cast, proposals],
  );

  const pick = useCallback((p: Pick) => {
    setPicked({ ...p, at: Date.now() });
    setPicking(false);
  }, []);
  const pickInversion = (inv: CastInversion) =>
    pick({
      pFrom: inv.class === 'spike' ? (cast.columns.pressure[inv.iTop + 1] ?? inv.pTop) : inv.pTop,
      pTo: inv.pBottom,
      variable: 'salinity',
    });
  const pickProposal = (p: Proposal) => {
    setCurrentId(p.id);
    pick({ pFrom: p.pFrom, pTo: p.pTo, variable: p.variable, flag: p.flag });
  };

  // the keyboard steps through the pending proposals (all of them once none is pending)
  const steppable = proposals.some((p) => p.status === 'pending')
    ? proposals.filter((p) => p.status === 'pending')
    : proposals;
  const current = proposals.find((p) => p.id === currentId) ?? null;
  const step = (d: 1 | -1, among: readonly Proposal[] = steppable) => {
    if (among.length === 0) return;
    const k = among.findIndex((p) => p.id === currentId);
    const next = among[k < 0 ? (d === 1 ? 0 : among.length - 1) : (k + d + among.length) % among.length];
    pickProposal(next);
    document.querySelector(`[data-proposal="${next.id}"]`)?.scrollIntoView({ block: 'nearest' });
  };
  // a rejected proposal is reopened; an accepted one is undone through its flag-log entry (it is pending again)
  const onReopen = (p: Proposal) => {
    if (p.status === 'rejected') reopen.mutate({ ids: [p.id] }, { onSuccess: () => setCurrentId(p.id) });
    else if (p.status === 'accepted' && p.flagChangeId)
      undo.mutate(p.flagChangeId, { onSuccess: () => setCurrentId(p.id) });
  };
  const onDecide = (d: Decision) => {
    decide.mutate(d, {
      onSuccess: () => {
        // move on to the next pending proposal, as a technician works down the list
        const rest = steppable.filter((p) => p.status === 'pending' && !(d.ids?.includes(p.id) || d.test === p.test));
        setCurrentId(rest[0]?.id ?? null);
      },
    });
  };
  const pendingCasts = useMemo(
    () => new Set((pendingQ.data ?? []).filter((x) => x.pending > 0).map((x) => x.castId)),
    [pendingQ.data],
  );
  const toPendingCast = (d: 1 | -1) => {
    const k = casts.findIndex((c) => c.id === cast.id);
    for (let j = 1; j < casts.length; j++) {
      const c = casts[(k + d * j + casts.length * 2) % casts.length];
      if (pendingCasts.has(c.id) && c.id !== cast.id) {
        navigate(`/cruises/${encodeURIComponent(cruise.id)}/casts/${encodeURIComponent(c.id)}${location.search}`);
        return;
      }
    }
  };
  useQcKeys({
    nextProposal: () => step(1),
    previousProposal: () => step(-1),
    nextAnyProposal: () => step(1, proposals),
    previousAnyProposal: () => step(-1, proposals),
    accept: mayFlag
      ? () => current?.status === 'pending' && onDecide({ ids: [current.id], decision: 'accept' })
      : undefined,
    reject: mayFlag
      ? () => current?.status === 'pending' && onDecide({ ids: [current.id], decision: 'reject' })
      : undefined,
    reopen: mayFlag ? () => current && current.status !== 'pending' && onReopen(current) : undefined,
    nextPendingCast: () => toPendingCast(1),
    previousPendingCast: () => toPendingCast(-1),
  });

  const pendingHere = proposals.filter((p) => p.status === 'pending').length;
  const near = neighboursQ.data?.neighbours ?? [];
  const neighbourText = near.length
    ? `Neighbours along ${neighboursQ.data?.order ?? 'the line'}: ${near.map((n) => `${n.role} ${n.station}`).join(', ')}.`
    : neighboursQ.isPending
      ? 'Loading the neighbouring casts…'
      : 'No neighbouring cast to overlay.';
  const earlierText = earlier?.partner
    ? `Then: station ${earlier.partner.station} of ${earlier.cruise} (${earlier.ship}), ${earlierDate(earlier)}, ${earlier.partner.offsetKm.toFixed(1)} km from this cast.`
    : earlierList.length && earlierId !== 'none'
      ? (earlierList.find((e) => e.note)?.note ?? null)
      : null;
  const figureProps = {
    cast,
    inversions: inversionSet.inversions,
    proposals,
    selecting: picking,
    onSelectRange: pick,
    range,
    pWindow,
  };

  return (
    <div className="grid items-start gap-4 xl:grid-cols-[minmax(0,1fr)_26rem]">
      <div className="flex min-w-0 flex-col gap-4">
        <div
          className="flex flex-wrap items-center gap-x-5 gap-y-2 rounded border border-paper-rule bg-paper-raised px-4 py-2"
          data-testid="compare-bar"
        >
          <LinePicker cruiseId={cruise.id} value={line} onChange={setLine} label="Neighbours along" />
          <EarlierChooser earlier={earlierList} value={earlierId} onChange={setEarlierChoice} />
          <p className="w-full text-xs text-ink-muted" data-testid="overlay-text">
            {neighbourText}
            {earlierText && (
              <>
                {' '}
                <span data-testid="earlier-text">{earlierText}</span>
              </>
            )}
          </p>
        </div>
        <Panel
          title="Measured profiles"
          titleId="measured"
          actions={
            <span className="flex items-center gap-2 text-2xs text-ink-muted">
              <span className="flex" role="group" aria-label="Pressure window">
                {([false, true] as const).map((u) => (
                  <button
                    key={String(u)}
                    type="button"
                    aria-pressed={upper === u}
                    onClick={() => setUpper(u)}
                    className={`h-6 border border-paper-rule px-2 text-2xs first:rounded-l last:rounded-r ${upper === u ? 'bg-ink text-paper' : 'text-ink-soft hover:bg-ink-wash'}`}
                  >
                    {u ? 'Upper 1500 dbar' : 'Full depth'}
                  </button>
                ))}
              </span>
            </span>
          }
        >
          <ProfileFigure
            {...figureProps}
            panels={measured}
            height={460}
            label={`Measured profiles of station ${cast.station} cast ${cast.cast}: ${measured.map((p) => p.title).join(', ')} against pressure`}
          />
          <Legend earlier={earlier} />
        </Panel>
        <Panel
          title="Derived profiles"
          titleId="profiles"
          actions={
            <label className="flex items-center gap-2 text-sm text-ink-soft">
              σ reference
              <select
                aria-label="Reference pressure of σ"
                value={ref}
                onChange={(e) => {
                  const next = new URLSearchParams(search);
                  if (e.target.value === '0') next.delete('ref');
                  else next.set('ref', e.target.value);
                  setSearch(next, { replace: true });
                }}
                className="h-7 rounded border border-paper-rule bg-paper-raised px-1.5 font-mono text-sm text-ink-strong"
              >
                {REFERENCE_PRESSURES.map((p) => (
                  <option key={p} value={p}>
                    {sigmaLabel(p)} · {p} dbar
                  </option>
                ))}
              </select>
            </label>
          }
        >
          <ProfileFigure
            {...figureProps}
            panels={derived}
            height={460}
            label={`Profiles of station ${cast.station} cast ${cast.cast}: CT, SA, ${sigmaLabel(ref)} and N² against pressure`}
          />
          <p className="border-t border-paper-rule px-4 py-1.5 text-2xs text-ink-muted">
            {sigmaLabel(ref)} computed in this browser from SA and CT (TEOS-10, 75-term polynomial); N² as stored at
            intake.
          </p>
        </Panel>
        <Panel
          title={
            earlier?.partner
              ? `T–S diagram, with the neighbouring stations and ${earlier.cruise}`
              : 'T–S diagram, with the neighbouring stations'
          }
          titleId="ts"
        >
          <TsPanel cast={cast} neighbours={neighbours} height={400} />
        </Panel>
        <Panel
          title={ref === 0 ? 'Density inversions: found at intake, and how each is handled now' : 'Density inversions'}
          titleId="inversions"
        >
          <InversionTable
            inversions={intake ?? inversionSet.inversions}
            source={
              intake
                ? `σ₀ as found at intake (deficit over ${INVERSION_THRESHOLD} kg/m³), kept whatever is flagged since`
                : inversionSet.source
            }
            handling={handling}
            onPick={mayFlag ? pickInversion : undefined}
          />
        </Panel>
        <Panel title="Flag log" titleId="flag-log">
          {log.isError ? (
            <ErrorNotice error={log.error} title="The flag log could not be loaded" />
          ) : (
            <FlagLog
              entries={log.data ?? []}
              mayUndo={mayFlag}
              busy={undo.isPending}
              error={undo.error}
              onUndo={(id) => undo.mutate(id)}
              onPick={(e) => pick({ pFrom: e.pFrom, pTo: e.pTo, variable: e.variable })}
            />
          )}
        </Panel>
      </div>
      <div className="flex flex-col gap-4">
        <Panel title={pendingHere ? `Proposed flags · ${pendingHere} pending` : 'Proposed flags'} titleId="proposals">
          {qc.isError ? (
            <ErrorNotice error={qc.error} title="The proposals could not be loaded" />
          ) : qc.data ? (
            <ProposalList
              qc={qc.data}
              currentId={currentId}
              mayDecide={mayFlag}
              busy={decide.isPending || reopen.isPending || undo.isPending}
              error={decide.error ?? reopen.error}
              onPick={pickProposal}
              onDecide={onDecide}
              onReopen={onReopen}
            />
          ) : (
            <Progress label="Loading the proposals…" />
          )}
        </Panel>
        {mayFlag && (
          <Panel title="Quality flags" titleId="flags">
            <FlagForm
              cruiseId={cruise.id}
              castId={cast.id}
              pressure={cast.columns.pressure}
              picked={picked}
              onRangeChange={setRange}
              picking={picking}
              onPickOnPlot={() => setPicking((v) => !v)}
            />
          </Panel>
        )}
        <Panel title="Cast" titleId="cast-meta">
          <CastMeta cast={cast} />
        </Panel>
        <Panel title="History of this cast" titleId="cast-history">
          <CastHistoryPanel castId={cast.id} />
        </Panel>
        <Panel title="Vertical coordinates" titleId="fitness">
          <FitnessTable fitness={cast.fitness} />
        </Panel>
        <Panel title="Processing notes" titleId="notes">
          {cast.notes.length === 0 ? (
            <p className="px-4 py-3 text-sm text-ink-muted">No notes.</p>
          ) : (
            <ul className="flex list-disc flex-col gap-1 py-2 pr-4 pl-8 text-sm text-ink-strong">
              {cast.notes.map((n, i) => (
                <li key={i}>{n}</li>
              ))}
            </ul>
          )}
        </Panel>
        <p className="px-1 text-2xs text-ink-muted">
          Proposals come from automatic tests and are not flags until a technician accepts them. Data on this desk are
          provisional research data, not for navigation.
        </p>
      </div>
    </div>
  );
}
