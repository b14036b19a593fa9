import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { LABELS } from '@shared/domain/codes';
import type { PinFilters } from '@shared/schemas/pins';
import { mapQueries } from '../api';
import { frostBandFor } from '../frost-bands';
import { DateText } from '../../units/components/date-text';
import { VarietyLink } from '../../varieties/components/variety-link';
import { useUnits } from '../../units/use-units';

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

/** The reports on one public grid cell: variety, type, crop, outcome, season and form of each. */
export function CellPopup({ lat, lon, reports, filters }: { lat: number; lon: number; reports: number; filters: PinFilters }) {
  const cell = useQuery(mapQueries.cell(lat, lon, filters));
  const shown = cell.data?.reports.slice(0, 4) ?? [];
  const total = cell.data?.total ?? reports;
  return (
    <div className="text-sm text-ink" aria-live="polite">
      <p className="pr-6 font-semibold text-fig-900">{total === 1 ? 'One report here' : `${total} reports on this cell`}</p>
      <p className="text-xs text-ink/70">Shown on a ~5 km grid cell, never the grower’s exact spot.</p>
      {cell.isPending && <p className="mt-2 text-ink/70">Loading…</p>}
      {cell.isError && <p className="mt-2 text-red-700">Could not load these reports. Try again.</p>}
      <ul className="mt-2 flex max-h-64 flex-col gap-2 overflow-y-auto">
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
      {total > shown.length && cell.data && <p className="mt-2 text-xs text-ink/70">and {total - shown.length} more here; zoom in or narrow the filters.</p>}
      <Link to={hereLink(lat, lon)} className="mt-2 inline-block text-xs font-medium text-leaf-700 underline underline-offset-2">
        What ripens around here
      </Link>
    </div>
  );
}

/** An empty spot: its coordinates and the way to the regional summary. */
export function PointPopup({ lat, lon }: { lat: number; lon: number }) {
  return (
    <div className="pr-5 text-sm text-ink">
      <p className="font-medium text-fig-900">{formatCoord(lat, lon)}</p>
      <Link to={hereLink(lat, lon)} className="mt-1 inline-block font-medium text-fig-600 underline underline-offset-2 hover:text-fig-700">
        What ripens here
      </Link>
    </div>
  );
}

export function StationPopup({ name, days50 }: { name: string; days50: number | null }) {
  const units = useUnits();
  const band = frostBandFor(days50);
  return (
    <div className="pr-5 text-sm text-ink">
      <p className="font-medium text-fig-900">{name}</p>
      <p className="mt-1 flex items-center gap-2">
        {band && <span className="inline-block h-3 w-3 rounded-full border border-ink/30" style={{ background: band.color }} aria-hidden />}
        {days50 === null ? 'No frost-free estimate yet' : `${days50} frost-free days in half the years (${units.temperature(32)})`}
      </p>
    </div>
  );
}

export function WaspAreaPopup({ name, source, observedOn, lat, lon }: { name: string; source: string; observedOn: string; lat: number; lon: number }) {
  return (
    <div className="pr-5 text-sm text-ink">
      <p className="font-medium text-leaf-700">Fig wasp established: {name}</p>
      <p className="mt-1 text-xs text-ink/70">
        Observed <DateText iso={observedOn} />. Source: {source}
      </p>
      <Link to={hereLink(lat, lon)} className="mt-1 inline-block text-xs font-medium text-fig-600 underline underline-offset-2">
        What ripens here
      </Link>
    </div>
  );
}
