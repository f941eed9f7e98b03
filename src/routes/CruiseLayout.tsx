import { Link, NavLink, Outlet, useOutletContext, useParams } from 'react-router-dom';
import { ErrorNotice, Progress } from '../components/Notice';
import { CRUISE_SECTIONS, CruiseHeader, useCruise, type Cruise } from '../features/cruises';
import { isApiError } from '../lib/http';

/** The cruise area: header, the sub-navigation from CRUISE_SECTIONS, then the section's screen. */
export default function CruiseLayout() {
  const { id = '' } = useParams();
  const cruise = useCruise(id);

  if (cruise.isPending) return <Progress label="Opening the cruise…" />;
  if (cruise.isError) {
    if (isApiError(cruise.error, 404)) {
      return (
        <div className="flex flex-col gap-3 py-8">
          <h1 className="text-xl font-semibold text-ink-strong">No such cruise</h1>
          <p className="text-sm text-ink-soft">Either it does not exist or you are not a member of it.</p>
          <p><Link to="/">Back to your cruises</Link></p>
        </div>
      );
    }
    return <ErrorNotice error={cruise.error} title="The cruise could not be loaded" />;
  }

  const sections = CRUISE_SECTIONS.filter((s) => !s.visibleTo || s.visibleTo(cruise.data.role));
  return (
    <div className="flex flex-col gap-5">
      <nav aria-label="Breadcrumb" className="-mb-2 text-xs text-ink-muted">
        <Link to="/" className="text-ink-muted">Cruises</Link> <span aria-hidden>/</span> <span className="text-ink-soft">{cruise.data.name}</span>
      </nav>
      <CruiseHeader cruise={cruise.data} />
      <nav aria-label="Cruise sections" className="-mt-5 flex gap-0.5 border-b border-paper-rule">
        {sections.map((s) => (
          <NavLink
            key={s.label}
            to={s.path ? `/cruises/${encodeURIComponent(id)}/${s.path}` : `/cruises/${encodeURIComponent(id)}`}
            end
            className={({ isActive }) =>
              `-mb-px border-b-2 px-3.5 py-2 text-sm no-underline ${isActive ? 'border-ink font-semibold text-ink-strong' : 'border-transparent text-ink-soft hover:border-ink/30 hover:text-ink-strong'}`
            }
          >
            {s.label}
          </NavLink>
        ))}
      </nav>
      <Outlet context={{ cruise: cruise.data } satisfies CruiseOutlet} />
    </div>
  );
}

export interface CruiseOutlet {
  cruise: Cruise;
}

/** The cruise the enclosing CruiseLayout loaded, for the screens inside it. */
export function useCurrentCruise(): Cruise {
  return useOutletContext<CruiseOutlet>().cruise;
}
