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
import { placeSearchQueries } from '../../src/features/places/api';
import { sampleNear } from '../shared/atlas-samples';

const query = { lat: 42.65, lon: -73.75, radiusKm: 100, form: 'container' } as const;

/** A fresh QueryClient whose cache already holds schema-valid answers, so nothing is fetched. */
function setup(children: ReactNode) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
  client.setQueryData(authQueries.me().queryKey, { user: null });
  // GeoNames: Albany, NY (coordinates and population recalled from memory, rounded).
  client.setQueryData(placeSearchQueries.nearest(query.lat, query.lon).queryKey, {
    place: { id: 5106834, name: 'Albany', context: 'NY, United States', country: 'US', lat: 42.653, lon: -73.756, population: 97_000 },
    distanceKm: 0.6,
  });
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
  it('names the place, shows the season, and one row per variety with its chance, evidence and margin', () => {
    setup(<HereResults near={sampleNear} query={query} />);
    expect(screen.getByTestId('here-title')).toHaveTextContent('What ripens near Albany, NY');
    expect(screen.getByTestId('season-days50')).toHaveTextContent('166 days');
    expect(screen.getByText(/Rests on 2 stations and 14 grower frost reports; nearest station 9 km away/)).toBeInTheDocument();
    expect(screen.getByTestId('wasp-status')).toHaveTextContent('Not recorded here');

    const rows = screen.getAllByTestId('variety-row');
    expect(rows.map((r) => within(r).getByRole('link').textContent)).toEqual(['Lantern Amber', 'Terrace Gold']);
    expect(within(rows[0]!).getByRole('link')).toHaveAttribute('href', '/varieties/11');
    const first = within(rows[0]!);
    // The model's chance with its interval.
    expect(first.getByRole('img', { name: 'Chance 78 %, likely between 66 % and 87 %, from 9 trees' })).toBeInTheDocument();
    expect(first.getByTitle('8 trees from 5 growers')).toHaveTextContent('8 / 5');
    expect(first.getByText('+61 days')).toBeInTheDocument();
    // The Smyrna type stays in the list, marked; the pollination sentence is said once per fig type.
    expect(within(rows[1]!).getByText(/needs the wasp/)).toBeInTheDocument();
    const notes = within(screen.getByTestId('pollination-notes')).getAllByRole('listitem');
    expect(notes).toHaveLength(2);
    expect(notes[0]).toHaveTextContent(/^Common/);
    expect(notes[1]).toHaveTextContent(/^Smyrna/);
  });

  it('opens a row for its details and sorts by a column', async () => {
    setup(<HereResults near={sampleNear} query={query} />);
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Show details of Lantern Amber' }));
    expect(screen.getByTestId('variety-details')).toHaveTextContent(/166 days here vs 125 needed \(growers’ reports\), head start 20 days/);
    await user.click(screen.getByRole('button', { name: /Trees \/ growers/ }));
    // Fewest trees first would be Terrace Gold (3); sorting a count starts with the largest.
    expect(screen.getAllByTestId('variety-row').map((r) => within(r).getByRole('link').textContent)).toEqual(['Lantern Amber', 'Terrace Gold']);
    await user.click(screen.getByRole('button', { name: /Trees \/ growers/ }));
    expect(screen.getAllByTestId('variety-row').map((r) => within(r).getByRole('link').textContent)).toEqual(['Terrace Gold', 'Lantern Amber']);
  });

  it('draws the calibrated chance when present, says when the evidence is too little, and marks one-tree figures', () => {
    const near = nearResponseSchema.parse({
      ...sampleNear,
      varieties: [
        { ...sampleNear.varieties[0]!, chance: { probability: 0.64, low: 0.5, high: 0.76, enoughEvidence: true, trees: 12 } },
        { ...sampleNear.varieties[1]!, chance: { probability: 0.2, low: 0, high: 0.9, enoughEvidence: false, trees: 1 } },
        // No model answer: the adjusted share, marked as resting on one tree.
        { ...sampleNear.varieties[0]!, varietyId: 12, rank: 3, name: 'Single Tree Fig', chance: null, all: { ...sampleNear.varieties[0]!.all, trees: 1 } },
      ],
    });
    setup(<HereResults near={near} query={query} />);
    const rows = screen.getAllByTestId('variety-row');
    expect(within(rows[0]!).getByRole('img', { name: 'Chance 64 %, likely between 50 % and 76 %, from 12 trees' })).toBeInTheDocument();
    expect(within(rows[1]!).getByTestId('chance-too-little')).toHaveTextContent('too little evidence (1 tree)');
    expect(within(rows[2]!).getByTestId('chance-thin')).toHaveTextContent('only 1 tree');
    expect(document.body.textContent).not.toMatch(/\b1 trees\b/);
  });

  it('puts the short-season summary on top and filters the table to it', async () => {
    setup(<HereResults near={sampleNear} query={query} />);
    expect(screen.getByTestId('short-season-summary')).toHaveTextContent('shortest 142 days');
    await userEvent.click(screen.getByLabelText('Show only these in the table'));
    expect(screen.getAllByTestId('variety-row').map((r) => within(r).getByRole('link').textContent)).toEqual(['Lantern Amber']);
  });

  it('follows the grower’s units: miles and °C', () => {
    localStorage.setItem('syconium.units', JSON.stringify({ temperature: 'C', distance: 'mi', locale: 'en-GB' }));
    setup(<HereResults near={sampleNear} query={query} />);
    // 100 km = 62 mi (NIST: 1 mi = 1.609344 km); 32 °F = 0 °C.
    expect(screen.getByText(/within 62 mi/)).toBeInTheDocument();
    expect(screen.getByText(/At 0 °C\./)).toBeInTheDocument();
  });

  it('says honestly when there is no season data in range', () => {
    const empty = nearResponseSchema.parse({
      ...sampleNear,
      season: { ...sampleNear.season, days10: null, days50: null, days90: null, lastSpringDoy50: null, firstFallDoy50: null, stationCount: 0, reportFrostCount: 0, nearestStationKm: null, stations: [] },
      varieties: [],
    });
    setup(<HereResults near={empty} query={query} />);
    expect(screen.getByText(/No season data within 100 km/)).toBeInTheDocument();
    expect(screen.getByText(/No season length is known within range/)).toBeInTheDocument();
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
