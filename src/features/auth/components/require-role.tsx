import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router';
import type { Role } from '@shared/domain/codes';
import { hasRole, useCurrentUser } from '../api';

/** Show children only to users with at least `role`; visitors go to sign-in, others see why not. */
export function RequireRole({ role, children }: { role: Role; children: ReactNode }) {
  const { user, isLoading } = useCurrentUser();
  const location = useLocation();
  if (isLoading) return <p className="p-8 text-ink/70">Loading…</p>;
  if (!user) return <Navigate to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  if (!hasRole(user, role)) {
    return (
      <div className="mx-auto max-w-lg p-8">
        <h1 className="text-xl font-semibold">Not available to your account</h1>
        <p className="mt-2 text-ink/80">This part of Syconium is for the {role} role. An admin can change roles.</p>
      </div>
    );
  }
  return <>{children}</>;
}
