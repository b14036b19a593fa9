import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ReactNode } from 'react';
import { MemoryRouter } from 'react-router';
import { describe, expect, it } from 'vitest';
import { nearResponseSchema } from '@shared/schemas/atlas';
import { seasonSuccessResponseSchema, shortSeasonResponseSchema } from '@shared/schemas/guidance';
import { stationDetailSchema } from '@shared/schemas/stations';
import { authQueries } from '../../src/features/auth/api';
import { guidanceQueries } from '../../src/features/guidance/api';
import { DiagnosisStepper } from '../../src/features/guidance/components/diagnosis-stepper';
import { HereResults } from '../../src/features/guidance/components/here-view';
import { stationQueries } from '../../src/features/stations/api';
import { sampleNear } from '../shared/atlas-samples';

const query = { lat: 42.65, lon: -73.75, radiusKm: 100, form: 'container' } as const;

/** A fresh QueryClient whose cache already holds schema-valid answers, so nothing is fetched. */
function setup(children: ReactNode) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
  client.setQueryData(authQueries.me().queryKey, { user: null });
  client.setQueryData(
    stationQueries.detail(3).queryKey,
    stationDetailSchema.parse({
      station: { id: 3, code: null, name: 'Sample station near', lat: 42.7, lon: -73.8, elevationM: null, firstDate: null, lastDate: null, dayCount: 0, days50: 169 },
      freezeYears: [],
      // Albany's 32 F dates (NCEI normals 1991-2020, unverified copy in CHECKS.md); 10/90 % season lengths invented
      summaries: [
        { thresholdF: 32, probability: 10, lastSpringDoy: 131, firstFallDoy: 276, seasonDays: 150, years: 30 },
        { thresholdF: 32, probability: 50, lastSpringDoy: 117, firstFallDoy: 288, seasonDays: 169, years: 30 },
        { thresholdF: 32, probability: 90, lastSpringDoy: 106, firstFallDoy: 305, seasonDays: 188, years: 30 },
      ],
    }),
  );
  client.setQueryData(
    guidanceQueries.seasonSuccess('container').queryKey,
    seasonSuccessResponseSchema.parse({ crop: 'main', form: 'container', reports: 0, withoutSeason: 0, fromOwnFrostDates: 0, fromStations: 0, bins: [], method: 'sample' }),
  );
  client.setQueryData(
    guidanceQueries.shortSeason(166, 'container').queryKey,
    shortSeasonResponseSchema.parse({
      seasonDays: 166,
      toleranceDays: 10,
      form: 'container',
      varieties: [{ varietyId: 11, name: 'Lantern Amber', figType: 'common', trees: 6, ripened: 5, growers: 4, reports: 12, share: 5 / 6, shortestRipeSeasonDays: 142 }],
      method: 'sample',
    }),
  );
  client.setQueryData(guidanceQueries.varieties().queryKey, {
    varieties: [
      { id: 11, name: 'Lantern Amber', synonyms: [], figType: 'common', bearsBreba: false, bearsMain: true, ripeningClass: 'early', typicalDaysToRipen: 125, notes: '', sources: '', status: 'accepted', isFictional: true },
      { id: 17, name: 'Terrace Gold', synonyms: [], figType: 'smyrna', bearsBreba: false, bearsMain: true, ripeningClass: 'late', typicalDaysToRipen: 185, notes: '', sources: '', status: 'accepted', isFictional: true },
    ],
  });
  return render(
    <QueryClientProvider client={client}>
      <MemoryRouter>{children}</MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('HereResults', () => {
  it('shows the season with what it rests on, and the ranked varieties with their evidence', () => {
    setup(<HereResults near={sampleNear} query={query} />);
    expect(screen.getByTestId('season-days50')).toHaveTextContent('166 days');
    expect(screen.getByText(/Rests on 2 stations and 14 grower frost reports; nearest station 9 km away/)).toBeInTheDocument();
    expect(screen.getByTestId('wasp-status')).toHaveTextContent('Not recorded here');

    const rows = screen.getAllByTestId('variety-row');
    expect(rows.map((r) => within(r).getByRole('heading').textContent)).toEqual(['Lantern Amber', 'Terrace Gold']);
    const first = within(rows[0]!);
    expect(first.getByText('16 reports · 8 trees · 5 growers')).toBeInTheDocument();
    expect(first.getByRole('img', { name: 'Ripened 75 %, 90 % interval 48 % to 90 %, adjusted 72 %' })).toBeInTheDocument();
    expect(first.getByText(/166 days here vs 125 needed \(growers’ reports\), head start 20 days, margin \+61 days/)).toBeInTheDocument();
    expect(first.queryByTestId('wasp-warning')).toBeNull();
    // The Smyrna type stays in the list, marked and explained.
    expect(within(rows[1]!).getByTestId('wasp-warning')).toHaveTextContent('Needs the fig wasp, which is not recorded here');
  });

  it('filters to varieties that ripened in seasons as short as this one', async () => {
    setup(<HereResults near={sampleNear} query={query} />);
    await userEvent.click(screen.getByLabelText(/Only varieties that ripened in places with a season as short/));
    expect(await screen.findByTestId('short-season-list')).toHaveTextContent('shortest season with ripe figs: 142 days');
    expect(screen.getAllByTestId('variety-row').map((r) => within(r).getByRole('heading').textContent)).toEqual(['Lantern Amber']);
  });

  it('says honestly when there is no season data in range', () => {
    const empty = nearResponseSchema.parse({
      ...sampleNear,
      season: { ...sampleNear.season, days10: null, days50: null, days90: null, lastSpringDoy50: null, firstFallDoy50: null, stationCount: 0, reportFrostCount: 0, nearestStationKm: null, stations: [] },
      varieties: [],
    });
    setup(<HereResults near={empty} query={query} />);
    expect(screen.getByText(/No season data within 100 km/)).toBeInTheDocument();
    expect(screen.getByLabelText(/Only varieties that ripened/)).toBeDisabled();
    expect(screen.getByText(/No reports of any variety within 100 km yet/)).toBeInTheDocument();
  });
});

describe('DiagnosisStepper', () => {
  it('asks the unripe branch its own questions and ends with causes and the latex caution', async () => {
    const user = userEvent.setup();
    setup(<DiagnosisStepper />);
    await user.click(screen.getByRole('button', { name: /Fruit stayed hard and green until frost/ }));
    expect(screen.getByRole('heading', { name: 'Which variety is it?' })).toBeInTheDocument();
    await user.selectOptions(screen.getByLabelText('Variety'), '11');
    expect(screen.getByRole('radio', { name: /Common \(no pollination needed\)/ })).toBeChecked();
    const titles: string[] = [];
    for (;;) {
      const title = screen.queryByRole('heading', { level: 2 })?.textContent ?? '';
      if (title.startsWith('Likely causes')) break;
      titles.push(title);
      if (title === 'Did you pinch the shoot tips?') {
        await user.click(screen.getByRole('radio', { name: 'No' }));
        expect(screen.getByRole('note', { name: 'Caution' })).toHaveTextContent('burn it in sunlight');
      }
      if (title === 'How is it grown?') await user.click(screen.getByRole('radio', { name: 'In the ground' }));
      await user.click(screen.getByRole('button', { name: /Next|See likely causes/ }));
    }
    // Only the questions of this branch (no plant origin, no tree age).
    expect(titles).toEqual(['Which variety is it?', 'Which crop did you watch?', 'How is it grown?', 'How much sun and warmth does it get?', 'Did you pinch the shoot tips?', 'How was it fed?', 'Where do you grow it? (optional)']);
    const causes = screen.getAllByTestId('cause');
    expect(causes.map((c) => within(c).getByRole('heading').textContent)).toContain('Fruit set came too late in the summer');
    expect(screen.getByText(/Without a place, this rests on your answers alone/)).toBeInTheDocument();
    expect(screen.getAllByRole('note', { name: 'Caution' }).some((n) => /Wear gloves and long sleeves/.test(n.textContent ?? ''))).toBe(true);
  });
});
