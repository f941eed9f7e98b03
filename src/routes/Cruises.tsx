import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Button } from '../components/Button';
import { ErrorNotice, Progress } from '../components/Notice';
import { Num } from '../components/Num';
import { EmptyState, PageHeader, Panel } from '../components/Panel';
import { roleLabel, useMe } from '../features/auth';
import { CreateCruiseForm, useCruises, type Cruise } from '../features/cruises';
import { cruiseDays } from '../lib/format';

export default function Cruises() {
  const cruises = useCruises();
  const me = useMe();
  const navigate = useNavigate();
  const [creating, setCreating] = useState(false);
  const list = cruises.data ?? [];
  const formOpen = creating || (cruises.isSuccess && list.length === 0);

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        kicker={me.data ? `Signed in as ${me.data.user.name}` : undefined}
        title="Cruises"
        meta="The cruises you belong to, with your role on each."
        actions={
          !formOpen && (
            <Button variant="primary" onClick={() => setCreating(true)}>
              New cruise
            </Button>
          )
        }
      />
      <div className={`grid gap-6 ${formOpen ? '2xl:grid-cols-[minmax(0,1fr)_34rem]' : ''}`}>
        <Panel title="Your cruises" titleId="your-cruises">
          {cruises.isPending && <Progress label="Loading your cruises…" />}
          {cruises.isError && (
            <div className="p-4">
              <ErrorNotice error={cruises.error} title="Your cruises could not be loaded" />
            </div>
          )}
          {cruises.isSuccess && list.length === 0 && (
            <EmptyState title="You are not on any cruise yet">
              Create one — you become its chief scientist and can invite the science party — or follow an invitation
              link from a chief scientist.
            </EmptyState>
          )}
          {list.length > 0 && <CruiseTable cruises={list} />}
        </Panel>
        {formOpen && (
          <Panel title="New cruise" titleId="new-cruise" className="order-first 2xl:order-none">
            <CreateCruiseForm
              onCreated={(cruise) => navigate(`/cruises/${encodeURIComponent(cruise.id)}`)}
              onCancel={list.length > 0 ? () => setCreating(false) : undefined}
            />
          </Panel>
        )}
      </div>
    </div>
  );
}

function CruiseTable({ cruises }: { cruises: readonly Cruise[] }) {
  const sorted = [...cruises].sort((a, b) => (b.startDate ?? '').localeCompare(a.startDate ?? ''));
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm" aria-label="Your cruises">
        <thead>
          <tr className="border-b border-paper-rule text-left text-xs uppercase tracking-[0.08em] text-ink-muted">
            <th scope="col" className="px-4 py-1.5 font-semibold">
              Cruise
            </th>
            <th scope="col" className="px-4 py-1.5 font-semibold">
              Your role
            </th>
            <th scope="col" className="px-4 py-1.5 font-semibold">
              Ship
            </th>
            <th scope="col" className="px-4 py-1.5 font-semibold">
              Dates
            </th>
            <th scope="col" className="px-4 py-1.5 font-semibold">
              Region
            </th>
            <th scope="col" className="px-4 py-1.5 text-right font-semibold">
              Stations
            </th>
            <th scope="col" className="px-4 py-1.5 text-right font-semibold">
              Casts
            </th>
          </tr>
        </thead>
        <tbody>
          {sorted.map((c) => {
            const days = cruiseDays(c.startDate, c.endDate);
            return (
              <tr key={c.id} className="border-b border-paper-rule/70 last:border-0 hover:bg-ink-wash/40">
                <td className="px-4 py-2">
                  <Link to={`/cruises/${encodeURIComponent(c.id)}`} className="font-semibold text-ink-strong">
                    {c.name}
                  </Link>
                  {c.locked && (
                    <span className="ml-2 border border-ink/30 px-1 text-[0.65rem] uppercase tracking-[0.08em] text-ink-soft">
                      locked
                    </span>
                  )}
                </td>
                <td className="px-4 py-2 whitespace-nowrap">{c.role ? roleLabel(c.role) : '—'}</td>
                <td className="px-4 py-2 whitespace-nowrap italic text-ink-soft">{c.ship}</td>
                <td className="px-4 py-2 whitespace-nowrap">
                  <Num>
                    {c.startDate ?? '…'} – {c.endDate ?? '…'}
                  </Num>
                  {days !== null && <span className="ml-1.5 text-xs text-ink-muted">{days} d</span>}
                </td>
                <td className="px-4 py-2 text-ink-soft">{c.region ?? '—'}</td>
                <td className="px-4 py-2 text-right">
                  <Num>{c.stationCount}</Num>
                </td>
                <td className="px-4 py-2 text-right">
                  <Num>{c.castCount}</Num>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
