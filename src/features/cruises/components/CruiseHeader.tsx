import { Num } from '../../../components/Num';
import { cruiseDays } from '../../../lib/format';
import { roleLabel } from '../../auth';
import type { Cruise } from '../types';
import { useState } from 'react';
import { Button } from '../../../components/Button';
import { useUpdateCruise } from '../api';

/** The chief scientist locks a cruise once its data are final: the server then refuses every data change
 * (409, from the route table's `changesData`); unlocking is audited too. */
function LockControl({ cruise }: { cruise: Cruise }) {
  const update = useUpdateCruise(cruise.id);
  const [confirming, setConfirming] = useState(false);
  if (cruise.role !== 'chief_scientist') return null;
  if (!confirming) {
    return (
      <Button variant="quiet" size="sm" onClick={() => setConfirming(true)}>
        {cruise.locked ? 'Unlock cruise' : 'Lock cruise'}
      </Button>
    );
  }
  return (
    <div
      role="group"
      aria-label="Confirm lock"
      className="flex max-w-md flex-col items-end gap-2 text-xs text-ink-soft"
    >
      <p className="text-right">
        {cruise.locked
          ? 'Unlock: uploads, quality flags, stations, column mappings, layer sets, derived variables and cruise details can change again.'
          : 'Lock: the data are frozen. No uploads, retries or reprocessing; no quality flags, stations, column mappings, layer sets, derived variables or cruise details change. The team, saved views and deliveries stay open.'}
      </p>
      <div className="flex items-center gap-2">
        <Button
          size="sm"
          variant="primary"
          busy={update.isPending}
          onClick={() => update.mutate({ locked: !cruise.locked }, { onSuccess: () => setConfirming(false) })}
        >
          {cruise.locked ? 'Unlock' : 'Lock'}
        </Button>
        <Button size="sm" variant="quiet" onClick={() => setConfirming(false)}>
          Back
        </Button>
      </div>
    </div>
  );
}

/**
 * The cruise's heading, compact: which screen this is and your role, the cruise's name, ship,
 * dates (and ports, region) on one or two lines, the lock for the chief scientist.
 */
export function CruiseHeader({ cruise, screen = 'Cruise desk' }: { cruise: Cruise; screen?: string }) {
  const days = cruiseDays(cruise.startDate, cruise.endDate);
  return (
    <header className="flex flex-wrap items-end gap-x-6 gap-y-1">
      <div className="flex flex-col">
        <p className="text-xs uppercase tracking-[0.14em] text-ink-muted">
          {screen}
          {cruise.role && <> · your role: {roleLabel(cruise.role)}</>}
          {cruise.locked && (
            <span className="ml-2 border border-ink/40 px-1.5 py-px text-[0.65rem] text-ink">Locked</span>
          )}
        </p>
        <h1 className="text-xl font-semibold leading-tight text-ink-strong">{cruise.name}</h1>
      </div>
      <dl className="flex flex-wrap gap-x-5 gap-y-1 pb-0.5 text-sm">
        <Meta term="Ship">{cruise.ship}</Meta>
        <Meta term="Dates">
          <Num>
            {cruise.startDate ?? '…'} – {cruise.endDate ?? '…'}
          </Num>
          {days !== null && <span className="ml-1.5 text-ink-muted">({days} days)</span>}
        </Meta>
        {(cruise.portStart || cruise.portEnd) && (
          <Meta term="Ports">
            {cruise.portStart ?? '—'} → {cruise.portEnd ?? '—'}
          </Meta>
        )}
        {cruise.region && <Meta term="Region">{cruise.region}</Meta>}
      </dl>
      <span className="flex-1" />
      <LockControl cruise={cruise} />
    </header>
  );
}

function Meta({ term, children }: { term: string; children: React.ReactNode }) {
  return (
    <div className="flex items-baseline gap-1.5">
      <dt className="text-xs uppercase tracking-[0.1em] text-ink-muted">{term}</dt>
      <dd className="text-ink-strong">{children}</dd>
    </div>
  );
}
