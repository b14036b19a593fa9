import { RequireRole } from '../features/auth/components/require-role';
import { UserRoleTable } from '../features/users/components/user-role-table';

export default function EditorsPeopleRoute() {
  return (
    <RequireRole role="admin">
      <div className="mx-auto max-w-5xl px-4 py-8">
        <h1 className="text-2xl font-semibold text-fig-900">People and roles</h1>
        <p className="mt-2 mb-6 text-ink/80">Growers post reports; editors curate and moderate; admins also manage roles. Every change is written to the audit log.</p>
        <UserRoleTable />
      </div>
    </RequireRole>
  );
}
