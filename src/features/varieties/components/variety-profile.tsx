import { lazy, Suspense } from 'react';
import { Link } from 'react-router';
import { LABELS } from '@shared/domain/codes';
import { plural } from '@shared/domain/units';
import type { VarietyPage } from '@shared/schemas/variety-page';
import { FollowButton } from '../../follows/components/follow-button';
import { WeeklyRipeBars } from '../../guidance/components/ripe-dates-chart';
import { useUnits } from '../../units/use-units';

const VarietyCellsMap = lazy(() => import('./variety-cells-map'));

const crops = (v: VarietyPage['variety']) => [v.bearsBreba ? 'breba' : null, v.bearsMain ? 'main crop' : null].filter(Boolean).join(' and ');

/** A variety's own page: what it is, where it ripened and failed, when, and how long it took. */
export function VarietyProfile({ page }: { page: VarietyPage }) {
  const units = useUnits();
  const { variety: v, totals, cells, ripeDates, daysNeeded, photos } = page;
  const sources = v.sources.split('\n').map((s) => s.trim()).filter(Boolean);
  const ripenedCells = cells.filter((c) => c.ripenedTrees > 0).length;
  return (
    <article className="flex flex-col gap-6" data-testid="variety-profile">
      <header className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <h1 className="text-2xl font-semibold tracking-tight text-fig-900">
            {v.name} {v.isFictional && <span className="align-middle rounded bg-fig-50 px-1.5 text-xs font-normal text-fig-700">fictional (demo)</span>}
          </h1>
          <p className="mt-1 text-ink/80">
            {LABELS.figType[v.figType]} fig · {crops(v)}
            {v.ripeningClass ? ` · ${LABELS.ripeningClass[v.ripeningClass]}` : ''}
            {v.typicalDaysToRipen ? ` · about ${v.typicalDaysToRipen} days from the last spring frost (catalogue)` : ''}
          </p>
          {v.synonyms.length > 0 && <p className="mt-1 text-sm text-ink/70">Also known as {v.synonyms.join(', ')}.</p>}
        </div>
        <FollowButton target={{ kind: 'variety', varietyId: v.id, name: v.name }} />
      </header>

      {v.notes && <p className="text-ink/90">{v.notes}</p>}

      <section className="grid grid-cols-2 gap-3 sm:grid-cols-4" aria-label="Evidence in the atlas">
        {[
          ['Reports', String(totals.reports)],
          ['Trees', String(totals.trees)],
          ['Growers', String(totals.growers)],
          ['Trees that ripened', String(totals.ripenedTrees)],
        ].map(([label, value]) => (
          <div key={label} className="rounded-md bg-fig-50 p-3">
            <p className="text-xs text-ink/70">{label}</p>
            <p className="text-lg font-semibold">{value}</p>
          </div>
        ))}
      </section>

      <section className="rounded-lg border border-fig-100 bg-white p-4">
        <h2 className="font-semibold text-fig-900">Where it ripened, and where it failed</h2>
        <p className="mb-2 text-sm text-ink/70">
          {cells.length === 0
            ? 'No published reports yet.'
            : `${plural(cells.length, 'grid cell')} with reports; ripe figs in ${ripenedCells} of them. Green: at least one tree ripened figs; rose: trees there never did. Each dot is a public grid cell of about ${units.distance(5)}, never a garden.`}
        </p>
        {cells.length > 0 && (
          <Suspense fallback={<div className="h-72 rounded-lg bg-fig-50" />}>
            <VarietyCellsMap cells={cells} label={`Map of the grid cells where ${v.name} was reported`} />
          </Suspense>
        )}
      </section>

      <div className="grid gap-6 md:grid-cols-2">
        <section className="rounded-lg border border-fig-100 bg-white p-4">
          <h2 className="font-semibold text-fig-900">First ripe figs, across the atlas</h2>
          {ripeDates.reports === 0 ? (
            <p className="mt-2 text-sm text-ink/70">No first-ripe dates reported yet.</p>
          ) : (
            <WeeklyRipeBars
              bins={ripeDates.bins}
              caption={
                <>
                  First ripe {ripeDates.crop === 'main' ? 'main-crop' : 'breba'} figs by week: {plural(ripeDates.reports, 'report')} from {plural(ripeDates.trees, 'tree')}; median{' '}
                  {units.dayOfYear(ripeDates.medianDoy)}.
                </>
              }
            />
          )}
        </section>
        <section className="rounded-lg border border-fig-100 bg-white p-4">
          <h2 className="font-semibold text-fig-900">The days it needed</h2>
          {daysNeeded.median === null ? (
            <p className="mt-2 text-sm text-ink/70">No report gave both its last spring frost and its first ripe fig yet.</p>
          ) : (
            <>
              <p className="mt-2 text-3xl font-semibold" data-testid="days-needed">
                {Math.round(daysNeeded.median)} days
              </p>
              <p className="text-sm text-ink/80">
                from the last spring frost to the first ripe main-crop fig (median of {plural(daysNeeded.reports, 'report')}
                {daysNeeded.reports >= 3 ? `; most between ${daysNeeded.low} and ${daysNeeded.high} days` : ''}).
              </p>
              {daysNeeded.reports < 3 && <p className="mt-1 text-xs text-amber-800">Rests on very few reports: take it as a first hint.</p>}
            </>
          )}
          <p className="mt-3 text-xs text-ink/70">Heat (growing degree-days) is not computed by the atlas yet; only days are shown.</p>
        </section>
      </div>

      {photos.length > 0 && (
        <section>
          <h2 className="font-semibold text-fig-900">Photos from growers’ reports</h2>
          <ul className="mt-2 grid grid-cols-3 gap-2 sm:grid-cols-6">
            {photos.map((p) => (
              <li key={p.thumbUrl}>
                <Link to={`/reports/${p.reportId}`} className="block overflow-hidden rounded-md border border-fig-100">
                  <img src={p.thumbUrl} alt={`${v.name}, season ${p.season}`} className="aspect-square w-full object-cover" loading="lazy" />
                </Link>
              </li>
            ))}
          </ul>
        </section>
      )}

      <section className="text-sm">
        <h2 className="font-semibold text-fig-900">Sources</h2>
        {sources.length ? (
          <ul className="mt-1 list-disc pl-5 text-ink/80">
            {sources.map((s) => (
              <li key={s}>{s}</li>
            ))}
          </ul>
        ) : (
          <p className="mt-1 text-ink/70">No source given for the catalogue entry.</p>
        )}
        <p className="mt-3">
          <Link to="/here" className="font-medium text-fig-600 underline">
            See how it does near you
          </Link>
        </p>
      </section>
    </article>
  );
}
