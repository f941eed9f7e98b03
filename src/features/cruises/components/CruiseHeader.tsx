import { PageHeader } from '../../../components/Panel';
import { Num } from '../../../components/Num';
import { cruiseDays } from '../../../lib/format';
import { roleLabel } from '../../auth';
import type { Cruise } from '../types';

export function CruiseHeader({ cruise }: { cruise: Cruise }) {
  const days = cruiseDays(cruise.startDate, cruise.endDate);
  return (
    <PageHeader
      kicker={
        <>
          Cruise desk{cruise.role && <> · your role: {roleLabel(cruise.role)}</>}
          {cruise.locked && <span className="ml-2 border border-ink/40 px-1.5 py-px text-[0.65rem] text-ink">Locked</span>}
        </>
      }
      title={cruise.name}
      meta={
        <dl className="flex flex-wrap gap-x-6 gap-y-1">
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
      }
    />
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
