import { useCallback, useMemo, useState } from 'react';
import { Navigate, useLocation, useParams, useSearchParams } from 'react-router-dom';
import { ErrorNotice, Progress } from '../components/Notice';
import { EmptyState, Panel } from '../components/Panel';
import { sigmaLabel } from '../components/plot/theme';
import { useCasts } from '../features/casts';
import {
  CastMeta, CastStepper, FitnessTable, FlagForm, InversionTable, inversionsAt, ProfilePanels, REFERENCE_PRESSURES, sigmaProfile, useCast,
  type CastDetail,
} from '../features/castsheet';
import { isApiError } from '../lib/http';
import { useCurrentCruise } from './CruiseLayout';

/** `/cruises/:id/casts` opens the first cast in track order. */
function FirstCast({ cruiseId }: { cruiseId: string }) {
  const casts = useCasts(cruiseId);
  if (casts.isPending) return <Progress label="Loading the casts…" />;
  if (casts.isError) return <ErrorNotice error={casts.error} title="The casts could not be loaded" />;
  if (casts.data.length === 0) {
    return (
      <Panel title="Casts">
        <EmptyState title="No casts yet">Casts appear as files come through intake; each opens here as a cast sheet.</EmptyState>
      </Panel>
    );
  }
  return <Navigate replace to={`/cruises/${encodeURIComponent(cruiseId)}/casts/${encodeURIComponent(casts.data[0].id)}`} />;
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
              Station <span className="font-mono">{cast.data.station}</span> <span className="font-normal text-ink-muted">·</span> cast{' '}
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
      {cast.isSuccess && <CastBody cast={cast.data} />}
    </div>
  );
}

function CastBody({ cast }: { cast: CastDetail }) {
  const cruise = useCurrentCruise();
  const [search, setSearch] = useSearchParams();
  const refParam = Number(search.get('ref') ?? 0);
  const ref = (REFERENCE_PRESSURES as readonly number[]).includes(refParam) ? refParam : 0;
  const [picking, setPicking] = useState(false);
  const [picked, setPicked] = useState<{ pFrom: number; pTo: number; at: number } | null>(null);
  const [range, setRange] = useState<{ pFrom: number; pTo: number } | null>(null);
  const mayFlag = (cruise.role === 'technician' || cruise.role === 'chief_scientist') && !cruise.locked;

  const sigma = useMemo(() => sigmaProfile(cast.columns.SA, cast.columns.CT, ref), [cast, ref]);
  const inversionSet = useMemo(() => inversionsAt(cast, ref, sigma), [cast, ref, sigma]);
  const onSelectRange = useCallback((pFrom: number, pTo: number) => {
    setPicked({ pFrom, pTo, at: Date.now() });
    setPicking(false);
  }, []);

  return (
    <div className="grid items-start gap-4 xl:grid-cols-[minmax(0,1fr)_24rem]">
      <div className="flex min-w-0 flex-col gap-4">
        <Panel
          title="Profiles"
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
          <ProfilePanels
            cast={cast}
            refPressure={ref}
            sigma={sigma}
            inversions={inversionSet.inversions}
            selecting={picking}
            onSelectRange={onSelectRange}
            range={range}
            height={540}
          />
          <p className="flex flex-wrap gap-x-4 gap-y-1 border-t border-paper-rule px-4 py-1.5 text-2xs text-ink-muted">
            <span>
              {sigmaLabel(ref)} computed in this browser from SA and CT (TEOS-10, 75-term polynomial); N² as stored at intake.
            </span>
            <span className="inline-flex items-center gap-1"><span className="inline-block h-2.5 w-3 border border-warn bg-warn-wash" aria-hidden /> inversion</span>
            <span className="inline-flex items-center gap-1"><span className="inline-block size-2 rounded-full border border-[#8a6d1f]" aria-hidden /> flag 3</span>
            <span className="inline-flex items-center gap-1"><span className="font-mono text-warn-strong" aria-hidden>×</span> flag 4</span>
          </p>
        </Panel>
        <Panel title="Density inversions" titleId="inversions">
          <InversionTable inversions={inversionSet.inversions} source={inversionSet.source} />
        </Panel>
      </div>
      <div className="flex flex-col gap-4">
        <Panel title="Cast" titleId="cast-meta">
          <CastMeta cast={cast} />
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
      </div>
    </div>
  );
}
