import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import type { NearResponse } from '@shared/schemas/atlas';
import { MethodNote } from '../../../components/method-note';
import { SavePlaceForm } from '../../places/components/save-place-form';
import { useCurrentUser } from '../../auth/api';
import { guidanceQueries, type PointQuery } from '../api';
import { SeasonSummary } from './season-summary';
import { SeasonSuccessChart } from './season-success-chart';
import { ShortSeasonList, useShortSeason } from './short-season-filter';
import { StationFrostChart } from './station-frost-chart';
import { VarietyRanking } from './variety-ranking';

/** Everything the atlas says about one point: season, wasp, ranked varieties, charts. */
export function HereView({ query }: { query: PointQuery }) {
  const near = useQuery(guidanceQueries.near(query));
  if (near.isLoading) return <p className="text-ink/70" role="status">Gathering the reports and stations near this point…</p>;
  if (near.error) return <p className="rounded-lg border border-fig-200 bg-white p-4 text-red-700" role="alert">The atlas could not answer: {near.error.message}</p>;
  if (!near.data) return null;
  return <HereResults near={near.data} query={query} />;
}

/** The results for a point, from a regional-engine answer (rendered directly in client tests). */
export function HereResults({ near, query }: { near: NearResponse; query: PointQuery }) {
  const { user } = useCurrentUser();
  const [shortOnly, setShortOnly] = useState(false);
  const days50 = near.season.days50;
  const shortSeason = useShortSeason(days50, query.form, shortOnly);
  const onlyIds = useMemo(() => (shortOnly && shortSeason.data ? new Set(shortSeason.data.varieties.map((v) => v.varietyId)) : null), [shortOnly, shortSeason.data]);
  const nearest = [...near.season.stations].sort((a, b) => a.distanceKm - b.distanceKm)[0];

  return (
    <div className="flex flex-col gap-6">
      <SeasonSummary near={near} />
      {nearest && (
        <section className="rounded-lg border border-fig-100 bg-white p-4">
          <h2 className="font-semibold text-fig-900">Frost dates at the nearest station</h2>
          <StationFrostChart stationId={nearest.id} distanceKm={nearest.distanceKm} />
        </section>
      )}

      <section aria-labelledby="ranking-title" className="flex flex-col gap-3">
        <div className="flex flex-wrap items-end justify-between gap-3">
          <div>
            <h2 id="ranking-title" className="text-xl font-semibold text-fig-900">
              What ripens here
            </h2>
            <p className="text-sm text-ink/70">
              {near.totals.reports} reports of {near.totals.trees} trees from {near.totals.growers} growers within {near.radiusKm} km.
            </p>
          </div>
          <label className={`flex items-center gap-2 text-sm ${days50 === null ? 'text-ink/50' : ''}`}>
            <input type="checkbox" checked={shortOnly} disabled={days50 === null} onChange={(e) => setShortOnly(e.target.checked)} />
            Only varieties that ripened in places with a season as short as this one
          </label>
        </div>
        {shortOnly && days50 !== null && <ShortSeasonList seasonDays={days50} form={query.form} />}
        <VarietyRanking near={near} onlyIds={onlyIds} />
        <MethodNote method={<>How the list is ranked: {near.method}</>}>
          Varieties are ranked by the chance of an edible crop in a typical season here, grown this way: learned from every tree of the variety and the length of their
          seasons, then adjusted by the trees nearby. A variety known from fewer than five trees shows “too little evidence” and comes after the others; one that needs the fig
          wasp where it is not recorded comes last. In each bar the tick is the share of trees that ripened, the green band the range it likely lies in (90 %), and the dot the
          share after weighting.{' '}
          <Link to="/accuracy" className="font-medium text-fig-600 underline">
            How good are these odds?
          </Link>
        </MethodNote>
      </section>

      <section className="rounded-lg border border-fig-100 bg-white p-4">
        <h2 className="font-semibold text-fig-900">Ripening and season length, across the atlas</h2>
        <SeasonSuccessChart form={query.form} localDays={days50} />
      </section>

      <section>
        {user ? (
          <SavePlaceForm lat={query.lat} lon={query.lon} form={query.form} />
        ) : (
          <p className="text-sm text-ink/70">
            <Link to={`/sign-in?next=${encodeURIComponent(`/here?lat=${query.lat}&lon=${query.lon}&form=${query.form}`)}`} className="font-medium text-fig-600 underline">
              Sign in
            </Link>{' '}
            to save this place, or make it your home.
          </p>
        )}
      </section>
    </div>
  );
}
