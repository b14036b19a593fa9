import { useQuery } from '@tanstack/react-query';
import { LABELS, ROLES, type Role } from '@shared/domain/codes';
import { useCurrentUser } from '../../auth/api';
import { useChangeRole, userQueries } from '../api';
import { DateText } from '../../units/components/date-text';

/** Admins see every account and change its role. */
export function UserRoleTable() {
  const { data, isLoading, error } = useQuery(userQueries.list());
  const changeRole = useChangeRole();
  const { user: me } = useCurrentUser();

  if (isLoading) return <p className="text-ink/70">Loading accounts…</p>;
  if (error) return <p role="alert">{error.message}</p>;

  return (
    <div className="overflow-x-auto rounded-lg border border-fig-100 bg-white">
      <table className="w-full text-left text-sm">
        <thead className="bg-fig-50 text-ink/70">
          <tr>
            <th className="px-3 py-2 font-medium">Name</th>
            <th className="px-3 py-2 font-medium">E-mail</th>
            <th className="px-3 py-2 font-medium">Joined</th>
            <th className="px-3 py-2 font-medium">Role</th>
          </tr>
        </thead>
        <tbody>
          {data?.users.map((user) => (
            <tr key={user.id} className="border-t border-fig-100">
              <td className="px-3 py-2">{user.displayName}</td>
              <td className="px-3 py-2 text-ink/80">{user.email}</td>
              <td className="px-3 py-2 text-ink/80"><DateText iso={user.createdAt} /></td>
              <td className="px-3 py-2">
                <select
                  aria-label={`Role of ${user.displayName}`}
                  className="rounded border border-fig-200 bg-white px-2 py-1"
                  value={user.role}
                  disabled={user.id === me?.id || changeRole.isPending}
                  onChange={(event) => changeRole.mutate({ id: user.id, role: event.target.value as Role })}
                >
                  {ROLES.map((role) => (
                    <option key={role} value={role}>
                      {LABELS.role[role]}
                    </option>
                  ))}
                </select>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
