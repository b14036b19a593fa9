import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router';
import { describe, expect, it } from 'vitest';
import { reportSchema } from '@shared/schemas/reports';
import { authQueries } from '../../src/features/auth/api';
import { ReportDetails } from '../../src/features/reports/components/report-details';

// An invented published report, as another grower or a visitor receives it (grid place only).
const report = reportSchema.parse({
  id: 41, treeId: 7, treeLabel: null, variety: null, proposedVarietyName: 'Sample Fig', lat: null, lon: null, gridLat: 42.675, gridLon: -73.775,
  form: 'ground', origin: 'cutting', yearPlanted: 2019, season: 2024, crop: 'main', outcome: 'ripened', firstRipeDate: '2024-08-20', lastHarvestDate: null,
  springFrostDate: null, fallFrostDate: null, pinched: false, pinchedDate: null, winterProtection: '', feeding: '', watering: '', notes: '', status: 'published',
  hiddenReason: null, hiddenAt: null, grower: { displayName: 'Sample Grower', supporter: false }, photos: [], createdAt: '2024-09-01T10:00:00.000Z', updatedAt: '2024-09-02T10:00:00.000Z',
  viewer: { isOwner: false, canModerate: false, hasOpenFlag: false, openFlags: 0 },
});

function setup(user: { id: number; displayName: string; role: 'grower' } | null) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
  client.setQueryData(authQueries.me().queryKey, { user: user && { ...user, email: 'sample@example.test', emailVerified: true, createdAt: '2024-01-01T00:00:00.000Z' } });
  render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <ReportDetails report={report} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('ReportDetails flagging', () => {
  it('asks a visitor to sign in first, coming back to this report', () => {
    setup(null);
    expect(screen.queryByRole('button', { name: 'Flag as doubtful' })).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Sign in to flag this report as doubtful' })).toHaveAttribute('href', '/sign-in?next=%2Freports%2F41');
    expect(screen.getByText('No')).toBeInTheDocument(); // pinched: a capitalised answer like the other facts
  });

  it('lets a signed-in grower open the flag form', async () => {
    setup({ id: 3, displayName: 'Another Grower', role: 'grower' });
    await userEvent.setup().click(screen.getByRole('button', { name: 'Flag as doubtful' }));
    expect(screen.getByLabelText('Why does this report look doubtful?')).toBeInTheDocument();
  });
});
