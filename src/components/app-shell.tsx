import { NavLink, Outlet, useNavigate } from 'react-router';
import { LABELS } from '@shared/domain/codes';
import { hasRole, useCurrentUser, useSignOut } from '../features/auth/api';
import { VerifyBanner } from '../features/email/components/verify-banner';
import { Logo } from './logo';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `rounded-md px-3 py-1.5 text-sm font-medium ${isActive ? 'bg-fig-100 text-fig-700' : 'text-ink/80 hover:bg-fig-50'}`;

/** The frame around every page: a slim top bar, then the page filling the rest of the screen. */
export function AppShell() {
  const { user } = useCurrentUser();
  const signOut = useSignOut();
  const navigate = useNavigate();

  return (
    <div className="flex h-full flex-col">
      <header className="z-20 flex flex-wrap items-center gap-x-4 gap-y-2 border-b border-fig-100 bg-paper/95 px-4 py-2 backdrop-blur">
        <NavLink to="/" className="flex items-center gap-2" aria-label="Syconium home">
          <Logo />
          <span className="text-lg font-semibold tracking-tight text-fig-700">Syconium</span>
        </NavLink>
        <nav aria-label="Main" className="flex flex-1 flex-wrap items-center gap-1">
          <NavLink to="/" end className={navClass}>
            Atlas
          </NavLink>
          <NavLink to="/here" className={navClass}>
            What ripens here
          </NavLink>
          <NavLink to="/why-no-figs" className={navClass}>
            Why no figs?
          </NavLink>
          {user && (
            <NavLink to="/my/reports" className={navClass}>
              My reports
            </NavLink>
          )}
          {hasRole(user, 'editor') && (
            <NavLink to="/editors" className={navClass}>
              Editors
            </NavLink>
          )}
        </nav>
        <div className="flex items-center gap-2 text-sm">
          {user ? (
            <>
              <NavLink to="/reports/new" className="rounded-md bg-fig-600 px-3 py-1.5 font-medium text-white hover:bg-fig-700">
                Post a report
              </NavLink>
              <NavLink to="/account" className={navClass}>
                {user.displayName} <span className="text-ink/60">· {LABELS.role[user.role]}</span>
              </NavLink>
              <button
                type="button"
                className="rounded-md px-3 py-1.5 text-ink/80 hover:bg-fig-50"
                onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/') })}
              >
                Sign out
              </button>
            </>
          ) : (
            <>
              <NavLink to="/sign-in" className={navClass}>
                Sign in
              </NavLink>
              <NavLink to="/sign-up" className="rounded-md bg-fig-600 px-3 py-1.5 font-medium text-white hover:bg-fig-700">
                Join
              </NavLink>
            </>
          )}
        </div>
      </header>
      <VerifyBanner />
      <main className="relative min-h-0 flex-1">
        <Outlet />
      </main>
    </div>
  );
}
