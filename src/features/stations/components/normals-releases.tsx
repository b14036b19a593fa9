import { useQuery } from '@tanstack/react-query';
import { stationQueries } from '../api';

/** The NOAA normals releases the atlas holds (reference data, apart from the stations listed here). */
export function NormalsReleases() {
  const { data } = useQuery(stationQueries.normals());
  if (!data || data.releases.length === 0) return null;
  return (
    <div className="mt-4 text-sm text-ink/80" data-testid="normals-releases">
      <h3 className="font-medium text-fig-900">Reference climate (NOAA normals)</h3>
      <ul className="mt-1 list-disc pl-5">
        {data.releases.map((r) => (
          <li key={r.name}>
            {r.name}: {r.stationCount.toLocaleString()} station{r.stationCount === 1 ? '' : 's'}, loaded {r.loadedAt.slice(0, 10)} ({r.source})
          </li>
        ))}
      </ul>
      <p className="mt-1 text-xs text-ink/70">
        Used wherever a station has no daily record of 20 years or more here; the atlas says which source each season figure rests on.
      </p>
    </div>
  );
}
