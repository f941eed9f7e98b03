import { NavLink, useNavigate } from 'react-router-dom';
import { useMe, useSignOut } from '../features/auth';
import { Brand } from './Brand';
import { Button } from './Button';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `px-2.5 py-1 text-sm no-underline rounded ${isActive ? 'bg-ink-wash text-ink-strong font-semibold' : 'text-ink-soft hover:text-ink-strong hover:bg-ink-wash/60'}`;

export function TopBar() {
  const me = useMe();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const user = me.data?.user;

  return (
    <header className="border-b border-ink/20 bg-paper print:hidden">
      <div className="mx-auto flex h-12 max-w-[1840px] items-center gap-6 px-6">
        <NavLink to="/" className="no-underline" aria-label="Sigmaline — your cruises">
          <Brand />
        </NavLink>
        <nav aria-label="Main" className="flex items-center gap-1">
          <NavLink to="/" end className={navClass}>
            Cruises
          </NavLink>
          {user?.isAdmin && (
            <NavLink to="/admin/mail" className={navClass}>
              Mail
            </NavLink>
          )}
        </nav>
        {user && (
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span className="text-ink-soft">
              <span className="font-semibold text-ink-strong">{user.name}</span>
              <span className="ml-2 hidden font-mono text-xs text-ink-muted md:inline">{user.email}</span>
              {user.isAdmin && (
                <span className="ml-2 border border-ink/30 px-1 py-px text-[0.65rem] uppercase tracking-[0.08em]">
                  site admin
                </span>
              )}
            </span>
            <Button
              size="sm"
              variant="secondary"
              busy={signOut.isPending}
              onClick={() => signOut.mutate(undefined, { onSettled: () => navigate('/signin', { replace: true }) })}
            >
              Sign out
            </Button>
          </div>
        )}
      </div>
    </header>
  );
}
