import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import type { NearResponse } from '@shared/schemas/atlas';
import { plural } from '@shared/domain/units';
import { MethodNote } from '../../../components/method-note';
import { FollowButton } from '../../follows/components/follow-button';
import { usePlaceName } from '../../places/components/place-name';
import { SavePlaceForm } from '../../places/components/save-place-form';
import { useCurrentUser } from '../../auth/api';
import { useUnits } from '../../units/use-units';
import { guidanceQueries, type PointQuery } from '../api';
import { SeasonSummary } from './season-summary';
import { SeasonSuccessChart } from './season-success-chart';
import { ShortSeasonSummary, useShortSeason } from './short-season-filter';
import { StationFrostChart } from './station-frost-chart';
import { VarietyTable } from './variety-table';

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
  const units = useUnits();
  const place = usePlaceName(query);
  const [shortOnly, setShortOnly] = useState(false);
  const days50 = near.season.days50;
  const shortSeason = useShortSeason(days50, query.form, true);
  const onlyIds = useMemo(() => (shortOnly && shortSeason.data ? new Set(shortSeason.data.varieties.map((v) => v.varietyId)) : null), [shortOnly, shortSeason.data]);
  // The year-by-year chart needs a daily record; normals stations give only their summary (shown above).
  const nearest = near.season.stations.filter((s) => s.source === 'daily').sort((a, b) => a.distanceKm - b.distanceKm)[0];
  const compareUrl = `/here/compare?${new URLSearchParams({ a: `${query.lat},${query.lon}`, form: query.form, radiusKm: String(query.radiusKm) })}`;

  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="ranking-title" className="flex flex-col gap-3">
        <div className="flex flex-wrap items-end justify-between gap-3">
          <div>
            <h2 id="ranking-title" className="text-xl font-semibold text-fig-900" data-testid="here-title">
              What ripens {place.label}
            </h2>
            <p className="text-sm text-ink/70">
              {plural(near.totals.reports, 'report')} of {plural(near.totals.trees, 'tree')} from {plural(near.totals.growers, 'grower')} within {units.distance(near.radiusKm)}
              {days50 !== null ? ` · typical frost-free season ${Math.round(days50)} days` : ''}.
            </p>
          </div>
          <Link to={compareUrl} className="text-sm font-medium text-fig-600 underline">
            Compare with another place
          </Link>
        </div>
        <ShortSeasonSummary seasonDays={days50} form={query.form} query={shortSeason} filtering={shortOnly} onFilter={setShortOnly} />
        <VarietyTable near={near} onlyIds={onlyIds} />
        <MethodNote method={<>How the list is ranked: {near.method}</>}>
          Varieties are ranked by the chance of an edible crop in a typical season here, grown this way: learned from every tree of the variety and the length of their
          seasons, then adjusted by the trees nearby. A variety known from fewer than five trees shows “too little evidence” and comes after the others; one that needs the fig
          wasp where it is not recorded comes last. Trees / growers counts the trees and growers behind each row. The chance bar shows the likely range as a band and the
          figure as a dot; a figure resting on one or two trees is drawn faint.{' '}
          <Link to="/accuracy" className="font-medium text-fig-600 underline">
            How good are these odds?
          </Link>
        </MethodNote>
      </section>

      <section className="flex flex-wrap items-start gap-6">
        {user ? (
          <>
            <FollowButton target={{ kind: 'place', name: place.town ?? `${query.lat.toFixed(2)}, ${query.lon.toFixed(2)}`, lat: query.lat, lon: query.lon }} />
            <SavePlaceForm lat={query.lat} lon={query.lon} form={query.form} />
          </>
        ) : (
          <p className="text-sm text-ink/70">
            <Link to={`/sign-in?next=${encodeURIComponent(`/here?lat=${query.lat}&lon=${query.lon}&form=${query.form}`)}`} className="font-medium text-fig-600 underline">
              Sign in
            </Link>{' '}
            to follow or save this place, or make it your home.
          </p>
        )}
      </section>

      <SeasonSummary near={near} />
      {nearest && (
        <section className="rounded-lg border border-fig-100 bg-white p-4">
          <h2 className="font-semibold text-fig-900">Frost dates at the nearest station with a daily record</h2>
          <StationFrostChart stationId={nearest.id} distanceKm={nearest.distanceKm} />
        </section>
      )}

      <section className="rounded-lg border border-fig-100 bg-white p-4">
        <h2 className="font-semibold text-fig-900">Ripening and season length, across the atlas</h2>
        <SeasonSuccessChart form={query.form} localDays={days50} />
      </section>
    </div>
  );
}
