import { Link, NavLink, Outlet, useLocation, useOutletContext, useParams } from 'react-router-dom';
import { ErrorNotice, Progress } from '../components/Notice';
import { CRUISE_TABS, CruiseHeader, useCruise, type Cruise } from '../features/cruises';
import { isApiError } from '../lib/http';

/** The cruise area: header, the sub-navigation from CRUISE_TABS, then the section's screen. */
export default function CruiseLayout() {
  const { id = '' } = useParams();
  const cruise = useCruise(id);
  const location = useLocation();

  if (cruise.isPending) return <Progress label="Opening the cruise…" />;
  if (cruise.isError) {
    if (isApiError(cruise.error, 404)) {
      return (
        <div className="flex flex-col gap-3 py-8">
          <h1 className="text-xl font-semibold text-ink-strong">No such cruise</h1>
          <p className="text-sm text-ink-soft">Either it does not exist or you are not a member of it.</p>
          <p>
            <Link to="/">Back to your cruises</Link>
          </p>
        </div>
      );
    }
    return <ErrorNotice error={cruise.error} title="The cruise could not be loaded" />;
  }

  const tabs = CRUISE_TABS.filter((s) => !s.visibleTo || s.visibleTo(cruise.data.role));
  const screen = screenName(location.pathname, id);
  return (
    <div className="flex flex-col gap-3">
      <nav aria-label="Breadcrumb" className="-mb-2 text-xs text-ink-muted print:hidden">
        <Link to="/" className="text-ink-muted">
          Cruises
        </Link>{' '}
        <span aria-hidden>/</span> <span className="text-ink-soft">{cruise.data.name}</span> <span aria-hidden>/</span>{' '}
        <span className="text-ink-soft">{screen}</span>
      </nav>
      <CruiseHeader cruise={cruise.data} screen={screen} />
      <nav aria-label="Cruise tabs" className="-mt-1 flex flex-wrap gap-0.5 border-b border-paper-rule print:hidden">
        {tabs.map((s) => (
          <NavLink
            key={s.label}
            to={s.path ? `/cruises/${encodeURIComponent(id)}/${s.path}` : `/cruises/${encodeURIComponent(id)}`}
            end
            className={({ isActive }) =>
              `-mb-px border-b-2 px-3 py-1.5 text-sm no-underline ${isActive ? 'border-ink font-semibold text-ink-strong' : 'border-transparent text-ink-soft hover:border-ink/30 hover:text-ink-strong'}`
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

/** The name of the cruise screen at a path: each tab names itself in the heading. */
function screenName(pathname: string, id: string): string {
  const rest = pathname.replace(`/cruises/${encodeURIComponent(id)}`, '').replace(/^\/+/, '');
  if (!rest) return 'Cruise desk';
  if (/^casts\/./.test(rest)) return 'Cast sheet';
  const hit = CRUISE_TABS.find((s) => s.path && (rest === s.path || rest.startsWith(`${s.path}/`)));
  return hit ? hit.label : 'Cruise';
}

export interface CruiseOutlet {
  cruise: Cruise;
}

/** The cruise the enclosing CruiseLayout loaded, for the screens inside it. */
export function useCurrentCruise(): Cruise {
  return useOutletContext<CruiseOutlet>().cruise;
}
