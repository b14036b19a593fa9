import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ReactNode } from 'react';
import { MemoryRouter } from 'react-router';
import { describe, expect, it } from 'vitest';
import type { CurrentUser } from '@shared/schemas/auth';
import type { DigestSettings as DigestSettingsData } from '@shared/schemas/email';
import { authQueries } from '../../src/features/auth/api';
import { emailQueries } from '../../src/features/email/api';
import { DevMailbox } from '../../src/features/email/components/dev-mailbox';
import { DigestSettings } from '../../src/features/email/components/digest-settings';
import { VerifyBanner } from '../../src/features/email/components/verify-banner';

const grower: CurrentUser = { id: 7, email: 'wren@example.com', displayName: 'Wren', role: 'grower', emailVerified: false, createdAt: '2026-12-01T00:00:00.000Z' };

/** A fresh QueryClient whose cache already holds the answers, so nothing is fetched. */
function setup(children: ReactNode, fill: (client: QueryClient) => void) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity, refetchInterval: false } } });
  fill(client);
  return render(
    <QueryClientProvider client={client}>
      <MemoryRouter>{children}</MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('verify banner', () => {
  it('explains drafts and offers a new link to an unverified grower', () => {
    setup(<VerifyBanner />, (c) => c.setQueryData(authQueries.me().queryKey, { user: grower }));
    expect(screen.getByText('Please confirm your e-mail address.')).toBeInTheDocument();
    expect(screen.getByText(/wren@example\.com/)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Send the link again' })).toBeEnabled();
  });

  it('stays away once the address is confirmed, and for visitors', () => {
    const { container } = setup(<VerifyBanner />, (c) => c.setQueryData(authQueries.me().queryKey, { user: { ...grower, emailVerified: true } }));
    expect(container).toBeEmptyDOMElement();
  });
});

describe('digest settings', () => {
  const settings = (home: DigestSettingsData['home']): DigestSettingsData => ({ active: false, radiusKm: 50, lastSentAt: null, home });

  it('asks for a home place before the digest can be turned on', () => {
    setup(<DigestSettings />, (c) => c.setQueryData(emailQueries.digest().queryKey, settings(null)));
    expect(screen.getByText(/Save a home place first/)).toBeInTheDocument();
    expect(screen.getByRole('checkbox', { name: 'Send me the weekly digest' })).toBeDisabled();
  });

  it('names the home place and refuses a radius beyond 200 km before sending anything', async () => {
    setup(<DigestSettings />, (c) => c.setQueryData(emailQueries.digest().queryKey, settings({ name: 'Orchard', lat: 45, lon: 3 })));
    expect(screen.getByText('Orchard')).toBeInTheDocument();
    const user = userEvent.setup();
    await user.click(screen.getByRole('checkbox', { name: 'Send me the weekly digest' }));
    const radius = screen.getByLabelText('Radius (km)');
    await user.clear(radius);
    await user.type(radius, '500');
    await user.click(screen.getByRole('button', { name: 'Save digest settings' }));
    expect(await screen.findByText('Use at most 200 km')).toBeInTheDocument();
  });
});

describe('development mailbox', () => {
  it('lists messages and shows the chosen one with its links', async () => {
    setup(<DevMailbox />, (c) => {
      c.setQueryData(emailQueries.devMail().queryKey, {
        messages: [{ id: 3, from: 'Syconium <atlas@syconium.invalid>', to: 'wren@example.com', subject: 'Confirm your e-mail for Syconium', receivedAt: '2026-12-02T01:00:00.000Z' }],
      });
      c.setQueryData(emailQueries.devMailMessage(3).queryKey, {
        id: 3,
        from: 'Syconium <atlas@syconium.invalid>',
        to: 'wren@example.com',
        subject: 'Confirm your e-mail for Syconium',
        receivedAt: '2026-12-02T01:00:00.000Z',
        text: 'Confirm my e-mail:\nhttp://127.0.0.1:3030/verify?token=abc',
        html: '<p>Confirm</p>',
      });
    });
    expect(screen.getByRole('heading', { name: 'Confirm your e-mail for Syconium' })).toBeInTheDocument();
    expect(screen.getByTitle('HTML part')).toHaveAttribute('sandbox', 'allow-top-navigation-by-user-activation');
    expect(screen.getByRole('link', { name: 'http://127.0.0.1:3030/verify?token=abc' })).toHaveAttribute('href', 'http://127.0.0.1:3030/verify?token=abc');
    await userEvent.setup().click(screen.getByRole('tab', { name: 'Text part' }));
    expect(screen.getByText(/Confirm my e-mail:/)).toBeInTheDocument();
  });
});
