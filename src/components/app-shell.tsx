import { useState } from 'react';
import { NavLink, Outlet, useLocation, useNavigate } from 'react-router';
import { LABELS } from '@shared/domain/codes';
import { hasRole, useCurrentUser, useSignOut } from '../features/auth/api';
import { VerifyBanner } from '../features/email/components/verify-banner';
import { OutboxStatus } from '../features/report-outbox/components/outbox-status';
import { Logo } from './logo';
import { UnitsControl, UnitsMenu } from '../features/units/components/units-control';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `whitespace-nowrap rounded-md px-3 py-1.5 text-sm font-medium ${isActive ? 'bg-fig-100 text-fig-700' : 'text-ink/80 hover:bg-fig-50'}`;

const primaryClass = 'rounded-md bg-fig-600 px-3 py-1.5 text-sm font-medium text-white hover:bg-fig-700';

/** The frame around every page: a slim top bar (a menu on phones), then the page filling the rest. */
export function AppShell() {
  const { user } = useCurrentUser();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const location = useLocation();
  const [menuFor, setMenuFor] = useState<string | null>(null);
  // The phone menu closes by itself when the page changes.
  const menuOpen = menuFor === location.key;

  const links = (
    <>
      <NavLink to="/" end className={navClass}>
        Atlas
      </NavLink>
      <NavLink to="/here" className={navClass}>
        What ripens here
      </NavLink>
      <NavLink to="/why-no-figs" className={navClass}>
        Why no figs?
      </NavLink>
      <NavLink to="/about" className={navClass}>
        About
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
      <NavLink to="/support" className={navClass}>
        Support
      </NavLink>
    </>
  );

  const account = user ? (
    <>
      <NavLink to="/account" className={navClass}>
        {user.displayName} <span className="text-ink/70">· {LABELS.role[user.role]}</span>
      </NavLink>
      <button
        type="button"
        className="rounded-md px-3 py-1.5 text-left text-sm text-ink/80 hover:bg-fig-50"
        onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/') })}
      >
        Sign out
      </button>
    </>
  ) : (
    <NavLink to="/sign-in" className={navClass}>
      Sign in
    </NavLink>
  );

  const primary = user ? (
    <NavLink to="/reports/new" className={primaryClass}>
      Post a report
    </NavLink>
  ) : (
    <NavLink to="/sign-up" className={primaryClass}>
      Join
    </NavLink>
  );

  return (
    <div className="flex h-full flex-col">
      {/* The first stop of the Tab key: straight past the header to the page (on the atlas, the town search and the map). */}
      <a href="#main" className="sr-only z-50 rounded-md bg-fig-700 px-3 py-2 text-sm font-medium text-white focus:not-sr-only focus:absolute focus:left-2 focus:top-2">
        Skip to the page
      </a>
      <header className="z-20 border-b border-fig-100 bg-paper/95 backdrop-blur">
        <div className="flex items-center gap-x-4 px-4 py-2">
          <NavLink to="/" className="flex items-center gap-2" aria-label="Syconium home">
            <Logo />
            <span className="text-lg font-semibold tracking-tight text-fig-700">Syconium</span>
          </NavLink>
          <nav aria-label="Main" className="hidden min-w-0 flex-1 items-center gap-1 overflow-x-auto lg:flex">
            {links}
          </nav>
          <div className="ml-auto flex items-center gap-2 lg:ml-0">
            <div className="hidden items-center gap-2 lg:flex">
              <UnitsMenu />
              {account}
            </div>
            {primary}
            <button
              type="button"
              className="rounded-md border border-fig-200 px-3 py-1.5 text-sm font-medium text-fig-700 lg:hidden"
              aria-expanded={menuOpen}
              aria-controls="phone-menu"
              onClick={() => setMenuFor(menuOpen ? null : location.key)}
            >
              {menuOpen ? 'Close' : 'Menu'}
            </button>
          </div>
        </div>
        {menuOpen && (
          <nav id="phone-menu" aria-label="Main" className="flex flex-col gap-1 border-t border-fig-100 px-4 py-3 lg:hidden">
            {links}
            <div className="mt-2 flex flex-col gap-1 border-t border-fig-100 pt-2">{account}</div>
            <div className="mt-2 border-t border-fig-100 pt-2">
              <UnitsControl compact />
            </div>
          </nav>
        )}
      </header>
      <VerifyBanner />
      <OutboxStatus />
      {/* Pages scroll inside themselves; clipping here stops a visually hidden table caption from widening the whole page on a phone. */}
      <main id="main" tabIndex={-1} className="relative min-h-0 flex-1 overflow-hidden focus:outline-none">
        <Outlet />
      </main>
    </div>
  );
}
