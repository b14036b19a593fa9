import { useEffect, useRef } from 'react';
import { NavLink, Outlet, useLocation } from 'react-router';
import { RequireRole } from '../features/auth/components/require-role';
import { hasRole, useCurrentUser } from '../features/auth/api';

const tabClass = ({ isActive }: { isActive: boolean }) =>
  `whitespace-nowrap rounded-md px-3 py-1.5 text-sm font-medium ${isActive ? 'bg-fig-600 text-white' : 'text-ink/80 hover:bg-fig-50'}`;

/** The editors' workspace: a row of tabs over the selected tool. */
export default function EditorsRoute() {
  const { user } = useCurrentUser();
  const { pathname } = useLocation();
  const tabsRef = useRef<HTMLElement>(null);
  // On a phone the tabs scroll sideways: keep the open one in view.
  // (A statement body: Chromium's scrollIntoView now returns a promise, which React would call as a cleanup.)
  useEffect(() => {
    tabsRef.current?.querySelector('[aria-current="page"]')?.scrollIntoView?.({ block: 'nearest', inline: 'nearest' });
  }, [pathname]);
  return (
    <RequireRole role="editor">
      <div className="flex h-full flex-col">
        <nav ref={tabsRef} aria-label="Editors' tools" className="flex gap-1 overflow-x-auto border-b border-fig-100 bg-white px-4 py-2">
          <NavLink to="/editors" end className={tabClass}>
            Overview
          </NavLink>
          <NavLink to="/editors/varieties" className={tabClass}>
            Varieties
          </NavLink>
          <NavLink to="/editors/wasp-areas" className={tabClass}>
            Wasp areas
          </NavLink>
          <NavLink to="/editors/stations" className={tabClass}>
            Stations
          </NavLink>
          <NavLink to="/editors/moderation" className={tabClass}>
            Moderation
          </NavLink>
          <NavLink to="/editors/audit" className={tabClass}>
            Audit log
          </NavLink>
          {hasRole(user, 'admin') && (
            <>
              <NavLink to="/editors/people" className={tabClass}>
                People
              </NavLink>
              <NavLink to="/editors/supporters" className={tabClass}>
                Supporters
              </NavLink>
            </>
          )}
        </nav>
        <div className="min-h-0 flex-1 overflow-y-auto">
          <Outlet />
        </div>
      </div>
    </RequireRole>
  );
}
