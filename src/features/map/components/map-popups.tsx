import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { LABELS } from '@shared/domain/codes';
import type { PinFilters } from '@shared/schemas/pins';
import { mapQueries } from '../api';
import { DateText } from '../../units/components/date-text';
import { VarietyLink } from '../../varieties/components/variety-link';
import { useUnits } from '../../units/use-units';
import { OUTCOME_RING_COLORS, ringSteps } from '../pin-rings';
import { OutcomeRing } from './outcome-ring';

const OUTCOME_TONE: Record<string, string> = {
  ripened: 'bg-leaf-100 text-leaf-700',
  unripe: 'bg-amber-soft/60 text-ink',
  dropped: 'bg-fig-100 text-fig-700',
  'no-fruit': 'bg-ink/5 text-ink/80',
};

function formatCoord(lat: number, lon: number): string {
  return `${Math.abs(lat).toFixed(3)}° ${lat >= 0 ? 'N' : 'S'}, ${Math.abs(lon).toFixed(3)}° ${lon >= 0 ? 'E' : 'W'}`;
}

function hereLink(lat: number, lon: number): string {
  return `/here?${new URLSearchParams({ lat: lat.toFixed(4), lon: lon.toFixed(4) })}`;
}

/** The heading every details view starts with (the popup's or the sheet's title). */
export function DetailsTitle({ children, id }: { children: React.ReactNode; id?: string }) {
  return (
    <h2 id={id} className="pr-8 text-[15px] leading-snug font-semibold text-fig-900">
      {children}
    </h2>
  );
}

/** The reports on one public grid cell: how they turned out, then each one, all reachable by scrolling. */
export function CellPopup({ lat, lon, reports, ripened, unripe, filters, titleId }: { lat: number; lon: number; reports: number; ripened: number; unripe: number; filters: PinFilters; titleId?: string }) {
  const cell = useQuery(mapQueries.cell(lat, lon, filters));
  const shown = cell.data?.reports ?? [];
  const total = cell.data?.total ?? reports;
  const other = reports - ripened - unripe;
  return (
    <div className="text-sm text-ink" aria-live="polite">
      <DetailsTitle id={titleId}>{total === 1 ? 'One report on this cell' : `${total} reports on this cell`}</DetailsTitle>
      <div className="mt-1.5 flex items-center gap-2.5">
        <OutcomeRing steps={ringSteps(reports, ripened, unripe)} size={34} />
        <p className="text-xs leading-snug text-ink/80">
          <span className="font-medium" style={{ color: OUTCOME_RING_COLORS.ripened }}>
            {ripened} ripened
          </span>
          {' · '}
          {unripe} still unripe{' · '}
          {other} dropped or no fruit
        </p>
      </div>
      <p className="mt-1.5 text-xs text-ink/70">Shown on a ~5 km grid cell, never the grower’s exact spot. Zooming in will not split it.</p>
      {cell.isPending && <p className="mt-2 text-ink/70">Loading…</p>}
      {cell.isError && <p className="mt-2 text-red-700">Could not load these reports. Try again.</p>}
      <ul className="mt-2 flex flex-col gap-2" aria-label="Reports on this cell">
        {shown.map((r) => (
          <li key={r.id} className="rounded-md border border-fig-100 bg-white p-2">
            <div className="flex items-baseline justify-between gap-2">
              <VarietyLink id={r.varietyId} name={r.varietyName} className="font-medium text-fig-700" />
              <span className="text-xs text-ink/70">{r.season}</span>
            </div>
            <p className="text-xs text-ink/70">{LABELS.figType[r.figType]}</p>
            <p className="mt-1 flex flex-wrap items-center gap-1 text-xs">
              <span className={`rounded px-1.5 py-0.5 ${OUTCOME_TONE[r.outcome]}`}>{LABELS.outcome[r.outcome]}</span>
              <span className="text-ink/70">· {LABELS.crop[r.crop]}</span>
              <span className="text-ink/70">· {LABELS.growingForm[r.form]}</span>
            </p>
            <Link to={`/reports/${r.id}`} className="mt-1 inline-block text-xs font-medium text-fig-600 underline underline-offset-2 hover:text-fig-700">
              Read the full report
            </Link>
          </li>
        ))}
      </ul>
      {cell.data && total > shown.length && (
        <p className="mt-2 text-xs text-ink/70">
          The newest {shown.length} of {total} are listed. One cell cannot be split by zooming in: narrow the filters (variety, season, crop) to see the others, or open the summary below.
        </p>
      )}
      <Link to={hereLink(lat, lon)} className="mt-2 inline-block text-xs font-medium text-leaf-700 underline underline-offset-2">
        What ripens around here
      </Link>
    </div>
  );
}

/** The season surface's reading at a point: the estimate there and what it stands on. */
function SeasonReadout({ lat, lon }: { lat: number; lon: number }) {
  const at = useQuery(mapQueries.seasonAt(lat, lon));
  if (at.isPending) return <p className="mt-2 text-xs text-ink/70">Reading the season…</p>;
  if (at.isError) return <p className="mt-2 text-xs text-red-700">Could not read the season here.</p>;
  const s = at.data.season;
  return (
    <div className="mt-2 rounded-md border border-fig-100 bg-white p-2 text-xs" data-testid="season-readout">
      {s.days50 === null ? (
        <p>No frost-free estimate here: nothing within {at.data.radiusKm} km.</p>
      ) : (
        <>
          <p className="text-sm">
            <span className="font-semibold text-fig-900" data-testid="season-days">
              {s.days50}
            </span>{' '}
            frost-free days in half the years (32 °F)
            {s.days10 !== null && s.days90 !== null && (
              <span className="text-ink/70">
                {' '}
                · {s.days10} in a short year, {s.days90} in a long one
              </span>
            )}
          </p>
          <p className="mt-1 text-ink/80">
            From {s.stationCount} station{s.stationCount === 1 ? '' : 's'}
            {s.nearestStationKm !== null && ` (nearest ${s.nearestStationKm} km)`} and {s.reportFrostCount} grower frost report{s.reportFrostCount === 1 ? '' : 's'} within {at.data.radiusKm} km.
          </p>
          {s.stations.length > 0 && (
            <ul className="mt-1 text-ink/70">
              {s.stations.slice(0, 3).map((st) => (
                <li key={st.id}>
                  {st.name}: {st.distanceKm} km{st.days50 !== null && `, ${st.days50} days`}
                </li>
              ))}
            </ul>
          )}
        </>
      )}
    </div>
  );
}

/** An empty spot: its coordinates, the season there when that layer is on, and the regional summary. */
export function PointPopup({ lat, lon, showSeason, titleId }: { lat: number; lon: number; showSeason: boolean; titleId?: string }) {
  return (
    <div className="text-sm text-ink">
      <DetailsTitle id={titleId}>{formatCoord(lat, lon)}</DetailsTitle>
      {showSeason && <SeasonReadout lat={lat} lon={lon} />}
      <Link to={hereLink(lat, lon)} className="mt-1.5 inline-block font-medium text-fig-600 underline underline-offset-2 hover:text-fig-700">
        What ripens here
      </Link>
    </div>
  );
}

export function StationPopup({ name, days50, titleId }: { name: string; days50: number | null; titleId?: string }) {
  const units = useUnits();
  return (
    <div className="text-sm text-ink">
      <DetailsTitle id={titleId}>{name}</DetailsTitle>
      <p className="mt-1">{days50 === null ? 'No frost-free estimate yet' : `${days50} frost-free days in half the years (${units.temperature(32)})`}</p>
      <p className="mt-1 text-xs text-ink/70">A climate station behind the season surface.</p>
    </div>
  );
}

export function WaspAreaPopup({ name, source, observedOn, lat, lon, titleId }: { name: string; source: string; observedOn: string; lat: number; lon: number; titleId?: string }) {
  return (
    <div className="text-sm text-ink">
      <DetailsTitle id={titleId}>Fig wasp established: {name}</DetailsTitle>
      <p className="mt-1 text-xs text-ink/70">
        Observed <DateText iso={observedOn} />. Source: {source}
      </p>
      <Link to={hereLink(lat, lon)} className="mt-1 inline-block text-xs font-medium text-fig-600 underline underline-offset-2">
        What ripens here
      </Link>
    </div>
  );
}
