import { QueryClientProvider } from '@tanstack/react-query';
import { renderHook, waitFor } from '@testing-library/react';
import type { ReactNode } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { CurrentUser } from '@shared/schemas/auth';
import { authQueries } from '../../src/features/auth/api';
import { useChangeRole } from '../../src/features/users/api';
import { createQueryClient } from '../../src/lib/query-client';

/*
 * An admin who changes a role: the users list is refreshed; when the account changed is the admin's
 * own, the app shows it with its new role at once (the role decides the menus and editor pages).
 * The app's own QueryClient and hook; only the network is scripted.
 */

const admin: CurrentUser = { id: 1, email: 'ada@example.com', displayName: 'Ada', role: 'admin', emailVerified: true, createdAt: '2026-12-01T00:00:00.000Z' };
const other: CurrentUser = { ...admin, id: 2, email: 'bo@example.com', displayName: 'Bo', role: 'grower' };
const json = (body: unknown) => new Response(JSON.stringify(body), { status: 200, headers: { 'Content-Type': 'application/json' } });

afterEach(() => vi.unstubAllGlobals());

function setup(changed: CurrentUser) {
  const queryClient = createQueryClient();
  queryClient.setQueryData(authQueries.me().queryKey, { user: admin });
  const fetchStub = vi.fn(async (input: RequestInfo | URL) => {
    const path = String(input);
    if (path === `/api/users/${changed.id}/role`) return json({ user: changed });
    if (path === '/api/auth/me') return json({ user: admin }); // a late answer would be the old role
    return json({ users: [] });
  });
  vi.stubGlobal('fetch', fetchStub);
  const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
  const { result } = renderHook(() => useChangeRole(), { wrapper });
  return { queryClient, result, fetchStub };
}

describe('changing a role', () => {
  it("shows the admin's own new role at once", async () => {
    const { queryClient, result } = setup({ ...admin, role: 'editor' });
    await result.current.mutateAsync({ id: admin.id, role: 'editor' });
    await waitFor(() => expect(queryClient.getQueryData(authQueries.me().queryKey)).toEqual({ user: { ...admin, role: 'editor' } }));
  });

  it("leaves the admin's own account as it is when another account changes", async () => {
    const { queryClient, result } = setup({ ...other, role: 'editor' });
    await result.current.mutateAsync({ id: other.id, role: 'editor' });
    expect(queryClient.getQueryData(authQueries.me().queryKey)).toEqual({ user: admin });
  });
});
