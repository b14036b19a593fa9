import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react';
import { MemoryRouter } from 'react-router';
import { describe, expect, it } from 'vitest';
import { modelAccuracySchema, type ModelAccuracy } from '@shared/schemas/accuracy';
import { reliabilityBins } from '@shared/domain/forecast-scores';
import { accuracyQueries } from '../../src/features/accuracy/api';
import { AccuracyView } from '../../src/features/accuracy/components/accuracy-view';

function show(body: ModelAccuracy) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
  client.setQueryData(accuracyQueries.current().queryKey, modelAccuracySchema.parse(body));
  return render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <AccuracyView />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

// Invented figures in the API's shape; the bins from the real binning function.
const p = [...Array(40).fill(0.75), ...Array(10).fill(0.25)];
const y = [...Array(30).fill(1), ...Array(10).fill(0), ...Array(3).fill(1), ...Array(7).fill(0)];
const ready: ModelAccuracy = {
  status: 'ready',
  computedAt: '2026-12-03T03:00:00.000Z',
  treeSeasons: 50,
  trees: 20,
  growers: 9,
  demoShare: 1,
  scores: { chance: { brier: 0.18, logLoss: 0.55 }, overallRate: { brier: 0.21, logLoss: 0.61 }, adjustedShare: { brier: 0.24, logLoss: 0.7 } },
  brierSkillScore: 1 - 0.18 / 0.21,
  bins: reliabilityBins(p, y),
  method: 'Leave-one-grower-out cross-validation (sample).',
};

describe('the accuracy page', () => {
  it('gives the three forecasts’ scores, the skill, n and the bins, and says the figures are invented demo data', () => {
    show(ready);
    expect(screen.getByRole('note')).toHaveTextContent('All these figures come from the invented demo data');
    expect(screen.getByText(/tree-seasons \(20 trees of 9 growers\)/)).toBeInTheDocument();
    expect(screen.getByRole('row', { name: /The chance shown in What ripens here 0\.180 0\.550/ })).toBeInTheDocument();
    expect(screen.getByRole('row', { name: /overall rate, everywhere 0\.210 0\.610/ })).toBeInTheDocument();
    expect(screen.getByText('0.143')).toBeInTheDocument();
    // The 70–80 % band: 40 tree-seasons, 75 % given, 75 % seen; the only band with 30 or more.
    expect(screen.getByRole('row', { name: '70–80 % 40 75 % 75 %' })).toBeInTheDocument();
    expect(screen.getByText(/In the one tenth with 30 or more tree-seasons the chance is off by at most 0 points/)).toBeInTheDocument();
  });

  it('says plainly when nothing has been computed yet, and gives no demo warning for real data', () => {
    show({ ...ready, status: 'pending', scores: null, bins: [], brierSkillScore: null, computedAt: null });
    expect(screen.getByText(/have not been worked out yet/)).toBeInTheDocument();
    show({ ...ready, demoShare: 0 });
    expect(screen.queryAllByRole('note')).toHaveLength(0);
  });
});
