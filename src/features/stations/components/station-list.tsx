import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { Button } from '../../../components/button';
import { stationQueries, useDeleteStation } from '../api';

/** Every station with its record span and median season; the selected one is highlighted. */
export function StationList({ selectedId, onDeleted }: { selectedId: number | null; onDeleted: (id: number) => void }) {
  const { data, isLoading, error } = useQuery(stationQueries.list());
  const remove = useDeleteStation();
  if (isLoading) return <p className="text-ink/70">Loading stations…</p>;
  if (error) return <p role="alert">{error.message}</p>;
  if (!data?.stations.length) return <p className="text-ink/70">No stations yet. Upload the first one with the form.</p>;

  return (
    <div className="max-h-[32rem] overflow-auto rounded-lg border border-fig-100 bg-white">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Climate stations</caption>
        <thead className="sticky top-0 bg-fig-50 text-ink/70">
          <tr>
            <th className="px-3 py-2 font-medium">Station</th>
            <th className="px-3 py-2 font-medium">Record</th>
            <th className="whitespace-nowrap px-3 py-2 text-right font-medium" title="Frost-free days at 32 °F in half the years">
              Typical season
            </th>
            <th className="px-3 py-2">
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {data.stations.map((station) => (
            <tr key={station.id} className={`border-t border-fig-100 ${station.id === selectedId ? 'bg-fig-50' : ''}`}>
              <td className="px-3 py-2">
                <Link to={`/editors/stations/${station.id}`} className="font-medium text-fig-700 hover:underline" aria-current={station.id === selectedId ? 'page' : undefined}>
                  {station.name}
                </Link>
                {station.code && <div className="text-xs text-ink/70">{station.code}</div>}
              </td>
              <td className="whitespace-nowrap px-3 py-2 text-ink/80">
                {station.firstDate?.slice(0, 4) ?? '—'}–{station.lastDate?.slice(0, 4) ?? '—'}
                <div className="text-xs text-ink/70">{station.dayCount.toLocaleString()} days</div>
              </td>
              <td className="whitespace-nowrap px-3 py-2 text-right tabular-nums">{station.days50 === null ? '—' : `${station.days50} days`}</td>
              <td className="px-3 py-2 text-right">
                <Button
                  variant="quiet"
                  className="px-2 py-1"
                  disabled={remove.isPending}
                  aria-label={`Delete ${station.name}`}
                  onClick={() => {
                    if (!window.confirm(`Delete ${station.name} and all of its days? This cannot be undone.`)) return;
                    remove.mutate(station.id, { onSuccess: () => onDeleted(station.id) });
                  }}
                >
                  Delete
                </Button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
