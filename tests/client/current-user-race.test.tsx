import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, Route, Routes } from 'react-router';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { CurrentUser } from '@shared/schemas/auth';
import { AppShell } from '../../src/components/app-shell';
import { createQueryClient } from '../../src/lib/query-client';
import SignInRoute from '../../src/routes/sign-in';
import VerifyRoute from '../../src/routes/verify';

/*
 * A freshly loaded page asks GET /api/auth/me at once. When the page's own request (confirming the
 * address, signing in) changes the account while that first answer is on its way, the answer is
 * older than the change. These tests hold it back until the change has been answered, as happened
 * once in a CI run of tests/e2e/email.test.ts, and check that the page shows the account as the
 * change left it. The app's own QueryClient, shell, routes and hooks; only the network is scripted.
 */

const wren: CurrentUser = { id: 7, email: 'wren@example.com', displayName: 'Wren', role: 'grower', emailVerified: false, createdAt: '2026-12-01T00:00:00.000Z' };
const BANNER = 'Please confirm your e-mail address.';

const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

/**
 * A scripted server: `current` is the account as it is now; the first GET /api/auth/me is answered
 * with the account as it was when it was asked, but only once `releaseFirstMe` is called.
 */
function scriptedServer(initial: CurrentUser | null, handlers: Record<string, (body: unknown) => { answer: unknown; now: CurrentUser | null }>) {
  let current = initial;
  let releaseFirstMe!: () => void;
  const firstMeReleased = new Promise<void>((resolve) => (releaseFirstMe = resolve));
  let meCalls = 0;
  const calls: string[] = [];
  const fetchStub = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const path = String(input);
    calls.push(`${init?.method ?? 'GET'} ${path}`);
    if (path === '/api/auth/me') {
      const answer = { user: current }; // read now, before any change below
      if (++meCalls === 1) await firstMeReleased; // ...and delivered late; a cancelled fetch still answers
      return json(answer);
    }
    const handler = handlers[path];
    if (!handler) return json({ error: { code: 'not_found', message: 'Not found' } }, 404);
    const { answer, now } = handler(init?.body ? JSON.parse(String(init.body)) : undefined);
    current = now;
    return json(answer);
  });
  return { fetchStub, releaseFirstMe, calls, meCalls: () => meCalls };
}

function renderApp(path: string) {
  return render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route element={<AppShell />}>
            <Route index element={<p>The atlas</p>} />
            <Route path="verify" element={<VerifyRoute />} />
            <Route path="sign-in" element={<SignInRoute />} />
          </Route>
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

/** Let the late answer land and TanStack Query settle (several turns: fetch, json, zod, notify). */
async function settle() {
  for (let i = 0; i < 20; i++) await new Promise((resolve) => setTimeout(resolve, 0));
}

describe('the signed-in account after a change, with an older GET /api/auth/me still on its way', () => {
  beforeEach(() => vi.useRealTimers());
  afterEach(() => vi.unstubAllGlobals());

  it('confirming the address removes the banner for good, though the first /me said "not confirmed"', async () => {
    const message = 'Your e-mail address is confirmed. New reports are published as soon as you save them.';
    const server = scriptedServer(wren, {
      '/api/auth/verify': () => ({ answer: { message, user: { ...wren, emailVerified: true } }, now: { ...wren, emailVerified: true } }),
    });
    vi.stubGlobal('fetch', server.fetchStub);

    renderApp('/verify?token=a-token-from-the-e-mail-0123456789');
    await waitFor(() => expect(server.calls).toContain('POST /api/auth/verify'));
    // The older answer ("signed in, not confirmed") arrives after the confirmation's.
    await settle();
    server.releaseFirstMe();
    expect(await screen.findByText(message)).toBeInTheDocument();
    await settle();
    expect(screen.queryByText(BANNER)).not.toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Sign out' })).toBeInTheDocument();
  });

  it('signing in shows the account for good, though the first /me said "visitor"', async () => {
    const server = scriptedServer(null, {
      '/api/auth/sign-in': () => ({ answer: { user: { ...wren, emailVerified: true } }, now: { ...wren, emailVerified: true } }),
    });
    vi.stubGlobal('fetch', server.fetchStub);

    renderApp('/sign-in');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'wren@example.com');
    await user.type(screen.getByLabelText('Password'), 'a long enough password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(server.calls).toContain('POST /api/auth/sign-in'));
    // The older answer ("visitor") arrives after the sign-in's.
    await settle();
    expect(server.meCalls()).toBe(1);
    server.releaseFirstMe();
    expect(await screen.findByText('The atlas')).toBeInTheDocument();
    await settle();
    expect(screen.getByRole('button', { name: 'Sign out' })).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Sign in' })).not.toBeInTheDocument();
  });
});
