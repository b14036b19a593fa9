import type { NearResponse } from '@shared/schemas/atlas';
import { MethodNote } from '../../../components/method-note';
import { useUnits } from '../../units/use-units';
import { plural } from '@shared/domain/units';

const days = (v: number | null) => (v === null ? '—' : `${Math.round(v)} days`);

/** The frost-free season at the point and the wasp's status, with what the numbers rest on. */
export function SeasonSummary({ near }: { near: NearResponse }) {
  const units = useUnits();
  const { season, wasp } = near;
  const noData = season.days50 === null;
  return (
    <section aria-labelledby="season-title" className="grid gap-4 md:grid-cols-[2fr_1fr]">
      <div className="rounded-lg border border-fig-100 bg-white p-4">
        <h2 id="season-title" className="font-semibold text-fig-900">
          Frost-free season here
        </h2>
        {noData ? (
          <p className="mt-2 text-ink/80">
            <strong className="font-medium">No season data within {units.distance(near.radiusKm)}.</strong> No climate station and no grower’s frost dates lie in range, so we do not guess. Try a
            larger radius.
          </p>
        ) : (
          <>
            <dl className="mt-3 grid grid-cols-3 gap-2 text-center">
              <div className="rounded-md bg-fig-50 p-2">
                <dt className="text-xs text-ink/70">
                  Short year <span className="whitespace-nowrap">(10 %)</span>
                </dt>
                <dd className="text-lg font-semibold">{days(season.days10)}</dd>
              </div>
              <div className="rounded-md bg-fig-100 p-2">
                <dt className="text-xs text-ink/70">
                  Typical year <span className="whitespace-nowrap">(50 %)</span>
                </dt>
                <dd className="text-lg font-semibold" data-testid="season-days50">
                  {days(season.days50)}
                </dd>
              </div>
              <div className="rounded-md bg-fig-50 p-2">
                <dt className="text-xs text-ink/70">
                  Long year <span className="whitespace-nowrap">(90 %)</span>
                </dt>
                <dd className="text-lg font-semibold">{days(season.days90)}</dd>
              </div>
            </dl>
            <p className="mt-2 text-sm text-ink/80">
              At {units.temperature(season.thresholdF)}.
              {season.lastSpringDoy50 !== null && season.firstFallDoy50 !== null && (
                <>
                  {' '}
                  Typical last spring frost {units.dayOfYear(season.lastSpringDoy50)}, first fall frost {units.dayOfYear(season.firstFallDoy50)}.
                </>
              )}
            </p>
          </>
        )}
        <MethodNote className="mt-2" method={season.method}>
          Rests on {plural(season.stationCount, 'station')} and {plural(season.reportFrostCount, 'grower frost report')}
          {season.nearestStationKm !== null ? `; nearest station ${units.distance(season.nearestStationKm)} away` : ''}.
        </MethodNote>
      </div>
      <div className={`rounded-lg border p-4 ${wasp.established ? 'border-leaf-300 bg-leaf-100/50' : 'border-fig-100 bg-white'}`}>
        <h2 className="font-semibold text-fig-900">Fig wasp</h2>
        <p className="mt-2 text-sm" data-testid="wasp-status">
          {wasp.established
            ? 'Recorded as established here: Smyrna and San Pedro main crops can be pollinated.'
            : 'Not recorded here: only figs that set without pollination (common types, and San Pedro brebas) can be expected.'}
        </p>
        {wasp.areas.length > 0 && (
          <ul className="mt-2 text-xs text-ink/70">
            {wasp.areas.map((a) => (
              <li key={a.id}>
                {a.name} (observed {units.date(a.observedOn)}; {a.source})
              </li>
            ))}
          </ul>
        )}
      </div>
    </section>
  );
}
