import { ErrorNotice, Progress } from '../components/Notice';
import { Num } from '../components/Num';
import { EmptyState, Panel } from '../components/Panel';
import { can } from '../features/auth';
import { CastsTable, RemovedCasts, useCasts } from '../features/casts';
import {
  AddStationForm,
  AuditTrail,
  StationList,
  StationMap,
  StationPlanEditor,
  StationTableImport,
  useStations,
} from '../features/cruises';
import { LinesDesk } from '../features/lines';
import { useCurrentCruise } from './CruiseLayout';

export default function CruiseDesk() {
  const cruise = useCurrentCruise();
  const stations = useStations(cruise.id);
  const casts = useCasts(cruise.id);
  const planned = stations.data ?? [];
  const occupied = planned.filter((s) => s.occupied).length;
  const castList = casts.data ?? [];
  const inversions = castList.reduce((n, c) => n + c.inversions, 0);
  const planning = can.planStations(cruise.role) && !cruise.locked;

  return (
    <div className="flex flex-col gap-5">
      {cruise.description && <p className="max-w-[80ch] text-sm text-ink-soft">{cruise.description}</p>}

      <dl
        className="grid grid-cols-2 border border-paper-rule bg-paper-raised sm:grid-cols-4"
        aria-label="Cruise status"
      >
        <Stat term="Planned stations" value={stations.isSuccess ? planned.length : '…'} />
        <Stat term="Occupied" value={stations.isSuccess ? occupied : '…'} />
        <Stat term="Casts" value={casts.isSuccess ? castList.length : '…'} />
        <Stat term="Density inversions" value={casts.isSuccess ? inversions : '…'} warn={inversions > 0} />
      </dl>

      <div className="grid gap-5 xl:grid-cols-[minmax(0,1.35fr)_minmax(0,1fr)]">
        <Panel title="Lines and stations" titleId="station-map">
          {stations.isPending && <Progress label="Loading the stations…" />}
          {stations.isError && (
            <div className="p-4">
              <ErrorNotice error={stations.error} title="The stations could not be loaded" />
            </div>
          )}
          {stations.isSuccess &&
            castList.length === 0 &&
            (planned.length === 0 ? (
              <EmptyState title="Nothing to map yet">
                The map shows the planned stations, the section line and what has been occupied.
              </EmptyState>
            ) : (
              <StationMap stations={planned} cruiseName={cruise.name} />
            ))}
          {stations.isSuccess &&
            (planned.length > 0 || castList.length > 0) &&
            (castList.length > 0 ? (
              <LinesDesk
                cruiseId={cruise.id}
                cruiseName={cruise.name}
                plan={planned}
                canEdit={(cruise.role === 'chief_scientist' || cruise.role === 'analyst') && !cruise.locked}
              />
            ) : null)}
        </Panel>
        <Panel
          title="Plan"
          titleId="station-plan"
          actions={
            stations.isSuccess && (
              <span className="text-xs text-ink-muted">
                <Num>{occupied}</Num> of <Num>{planned.length}</Num> occupied
              </span>
            )
          }
        >
          {stations.isPending && <Progress label="Loading the plan…" />}
          {stations.isError && (
            <div className="p-4">
              <ErrorNotice error={stations.error} title="The plan could not be loaded" />
            </div>
          )}
          {stations.isSuccess &&
            (planning ? (
              <StationPlanEditor cruiseId={cruise.id} stations={planned} />
            ) : (
              <StationList stations={planned} />
            ))}
          {planning && <AddStationForm cruiseId={cruise.id} />}
          {planning && <StationTableImport cruiseId={cruise.id} />}
        </Panel>
      </div>

      <Panel title="Casts" titleId="casts">
        {casts.isPending && <Progress label="Loading the casts…" />}
        {casts.isError && (
          <div className="p-4">
            <ErrorNotice error={casts.error} title="The casts could not be loaded" />
          </div>
        )}
        {casts.isSuccess && (
          <CastsTable
            casts={castList}
            actions={{
              cruiseId: cruise.id,
              canRemove: can.editCruise(cruise.role) && !cruise.locked,
              canDecide: can.uploadCasts(cruise.role) && !cruise.locked,
            }}
          />
        )}
        <RemovedCasts cruiseId={cruise.id} canRestore={can.editCruise(cruise.role) && !cruise.locked} />
      </Panel>

      <Panel title="Audit trail" titleId="audit-trail">
        <AuditTrail cruiseId={cruise.id} />
      </Panel>
    </div>
  );
}

function Stat({ term, value, warn = false }: { term: string; value: number | string; warn?: boolean }) {
  return (
    <div className="border-paper-rule px-4 py-2.5 not-last:border-r">
      <dt className="text-xs uppercase tracking-[0.1em] text-ink-muted">{term}</dt>
      <dd className={`font-mono text-xl tabular-nums ${warn ? 'text-warn' : 'text-ink-strong'}`}>{value}</dd>
    </div>
  );
}
