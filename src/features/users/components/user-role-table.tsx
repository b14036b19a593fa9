import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { LABELS, ROLES, type Role } from '@shared/domain/codes';
import type { CurrentUser } from '@shared/schemas/auth';
import { Button } from '../../../components/button';
import { inputClass } from '../../../components/form-field';
import { useCurrentUser } from '../../auth/api';
import { Pager, filterClass, type PageState } from '../../editors/components/data-table';
import { useChangeRole, userQueries } from '../api';
import { DateText } from '../../units/components/date-text';

const ROLE_MEANS: Record<Role, string> = {
  grower: 'posts and edits their own reports',
  editor: 'also curates the catalogue, wasp areas and stations, and moderates reports',
  admin: 'also manages everyone’s roles',
};

interface PendingChange {
  user: CurrentUser;
  role: Role;
}

/**
 * Admins find an account (search by name or e-mail, filter by role, page by page: all on the
 * server) and change its role: a change is asked for once more, then said to be done.
 */
export function UserRoleTable() {
  const [text, setText] = useState('');
  const [q, setQ] = useState('');
  const [role, setRole] = useState<Role | ''>('');
  const [page, setPage] = useState<PageState>({ limit: 25, offset: 0 });
  useEffect(() => {
    const timer = setTimeout(() => {
      setQ(text.trim());
      setPage((p) => ({ ...p, offset: 0 }));
    }, 250);
    return () => clearTimeout(timer);
  }, [text]);
  const { data, isLoading, error } = useQuery(userQueries.list({ q: q || undefined, role: role || undefined, page: page.offset / page.limit + 1, pageSize: page.limit }));
  const changeRole = useChangeRole();
  const { user: me } = useCurrentUser();
  const [pending, setPending] = useState<PendingChange | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const users = data?.users ?? [];
  const total = data?.total ?? 0;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex min-w-[14rem] flex-1 flex-col gap-1 text-sm font-medium">
          Find a person
          <input type="search" className={inputClass} value={text} onChange={(e) => setText(e.target.value)} placeholder="Name or e-mail" />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium">
          Role
          <select
            className={filterClass}
            value={role}
            onChange={(e) => {
              setRole(e.target.value as Role | '');
              setPage((p) => ({ ...p, offset: 0 }));
            }}
          >
            <option value="">Any role</option>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {LABELS.role[r]}
              </option>
            ))}
          </select>
        </label>
      </div>
      <p role="status" className="text-sm text-leaf-700 empty:hidden" data-testid="role-done">
        {done}
      </p>
      {error && <p role="alert">{error.message}</p>}
      <div className="rounded-lg border border-fig-100 bg-white">
        <div className="overflow-x-auto">
          <table className="table-cards w-full text-left text-sm">
            <caption className="sr-only">People and their roles</caption>
            <thead className="bg-fig-50 text-ink/70">
              <tr>
                <th scope="col" className="px-3 py-2 font-medium">
                  Name
                </th>
                <th scope="col" className="px-3 py-2 font-medium">
                  E-mail
                </th>
                <th scope="col" className="px-3 py-2 font-medium">
                  Joined
                </th>
                <th scope="col" className="px-3 py-2 font-medium">
                  Role
                </th>
              </tr>
            </thead>
            <tbody>
              {users.map((user) => (
                <tr key={user.id} className="border-t border-fig-100">
                  <td className="px-3 py-2 font-medium" data-label="Name">
                    {user.displayName}
                  </td>
                  <td className="break-all px-3 py-2 text-ink/80" data-label="E-mail">
                    {user.email}
                  </td>
                  <td className="px-3 py-2 text-ink/80" data-label="Joined">
                    <DateText iso={user.createdAt} />
                  </td>
                  <td className="px-3 py-2" data-label="Role">
                    <select
                      aria-label={`Role of ${user.displayName}`}
                      className="rounded border border-fig-200 bg-white px-2 py-1"
                      value={user.role}
                      disabled={user.id === me?.id || changeRole.isPending}
                      title={user.id === me?.id ? 'Another admin can change your own role' : undefined}
                      onChange={(event) => {
                        setDone(null);
                        setPending({ user, role: event.target.value as Role });
                      }}
                    >
                      {ROLES.map((r) => (
                        <option key={r} value={r}>
                          {LABELS.role[r]}
                        </option>
                      ))}
                    </select>
                  </td>
                </tr>
              ))}
              {users.length === 0 && (
                <tr>
                  <td colSpan={4} className="px-3 py-6 text-center text-ink/70">
                    {isLoading ? 'Loading accounts…' : 'Nobody matches.'}
                  </td>
                </tr>
              )}
            </tbody>
          </table>
        </div>
        <Pager page={page} total={total} first={total === 0 ? 0 : page.offset + 1} last={Math.min(total, page.offset + users.length)} onPageChange={setPage} />
      </div>
      {pending && (
        <ConfirmRoleChange
          change={pending}
          busy={changeRole.isPending}
          error={changeRole.error?.message ?? null}
          onCancel={() => {
            changeRole.reset();
            setPending(null);
          }}
          onConfirm={() =>
            changeRole.mutate(
              { id: pending.user.id, role: pending.role },
              {
                onSuccess: () => {
                  setDone(`Done: ${pending.user.displayName} is now ${LABELS.role[pending.role].toLowerCase()}. The change is in the audit log.`);
                  setPending(null);
                },
              },
            )
          }
        />
      )}
    </div>
  );
}

/** A modal question (the browser's own dialog: Escape cancels, focus stays inside). */
function ConfirmRoleChange({ change, busy, error, onCancel, onConfirm }: { change: PendingChange; busy: boolean; error: string | null; onCancel: () => void; onConfirm: () => void }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal?.();
    return () => dialog?.close?.();
  }, []);
  const { user, role } = change;
  return (
    <dialog
      ref={ref}
      aria-labelledby="role-change-title"
      aria-describedby="role-change-text"
      onCancel={(e) => {
        e.preventDefault();
        onCancel();
      }}
      className="m-auto w-[min(28rem,92vw)] rounded-lg border border-fig-100 bg-white p-5 text-ink shadow-xl backdrop:bg-ink/40"
    >
      <h2 id="role-change-title" className="text-lg font-semibold text-fig-900">
        Change {user.displayName}’s role?
      </h2>
      <p id="role-change-text" className="mt-2 text-sm">
        From {LABELS.role[user.role].toLowerCase()} to <strong>{LABELS.role[role].toLowerCase()}</strong>: an {LABELS.role[role].toLowerCase()} {ROLE_MEANS[role]}. It takes effect at once.
      </p>
      {error && (
        <p role="alert" className="mt-2 text-sm text-red-700">
          {error}
        </p>
      )}
      <div className="mt-4 flex justify-end gap-2">
        <Button type="button" variant="quiet" onClick={onCancel} autoFocus>
          Cancel
        </Button>
        <Button type="button" onClick={onConfirm} disabled={busy}>
          {busy ? 'Changing…' : `Make ${LABELS.role[role].toLowerCase()}`}
        </Button>
      </div>
    </dialog>
  );
}
