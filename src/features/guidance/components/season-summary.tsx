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
        {season.freezeNote === 'any-month' ? (
          <p className="mt-2 text-ink/80" data-testid="season-freeze-note">
            <strong className="font-medium">No frost-free season defined.</strong> At the stations in range a freeze can come in any month, so no frost dates are given.
          </p>
        ) : noData ? (
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
              {season.freezeNote === 'never' && <span data-testid="season-freeze-note"> Frost-free all year: the stations record no freeze, so no frost date is given.</span>}
              {season.lastSpringDoy50 !== null && season.firstFallDoy50 !== null && (
                <>
                  {' '}
                  Typical last spring frost {units.dayOfYear(season.lastSpringDoy50)}, first fall frost {units.dayOfYear(season.firstFallDoy50)}.
                </>
              )}
            </p>
            <ClimateExtras season={season} />
          </>
        )}
        <MethodNote className="mt-2" method={season.method}>
          Rests on {plural(season.stationCount, 'station')} and {plural(season.reportFrostCount, 'grower frost report')}
          {season.nearestStationKm !== null ? `; nearest station ${units.distance(season.nearestStationKm)} away` : ''}
          {season.sources.length > 0 && <> ({season.sources.map((s) => (s.source === 'normals' ? `NOAA normals ${s.period ?? ''}: ${s.stations}` : `daily records${s.period ? ` ${s.period}` : ''}: ${s.stations}`)).join('; ')})</>}.
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

/** Heat and the hardiness zone, when stations in range give them (a line each, small). */
function ClimateExtras({ season }: { season: NearResponse['season'] }) {
  const units = useUnits();
  if (season.gdd50F === null && season.hardinessZone === null) return null;
  return (
    <p className="mt-1 text-sm text-ink/80" data-testid="season-extras">
      {season.gdd50F !== null && <>Heat in a typical year: about {Math.round(season.gdd50F).toLocaleString()} growing degree days (base 50 °F / 10 °C). </>}
      {season.hardinessZone !== null && season.extremeMinF !== null && (
        <span data-testid="hardiness-zone">
          Hardiness zone {season.hardinessZone} (average coldest night {units.temperature(season.extremeMinF)}, from {plural(season.coldStationCount, 'station')} with a daily record).
        </span>
      )}
    </p>
  );
}
