import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { VarietyLink } from '../../varieties/components/variety-link';
import { followQueries, useFollowMutation } from '../api';

/** The varieties and places the grower follows, each with a way to stop. */
export function FollowList() {
  const list = useQuery(followQueries.mine());
  const mutation = useFollowMutation();
  if (list.isLoading) return <p className="text-ink/70">Loading…</p>;
  if (list.error) return <p role="alert" className="text-red-800">{list.error.message}</p>;
  const { varieties, places } = list.data!;
  if (varieties.length === 0 && places.length === 0)
    return <p className="text-sm text-ink/70">You follow nothing yet. Open a variety’s page, or What ripens here for a place, and press Follow.</p>;
  const stop = 'text-sm text-fig-700 underline disabled:opacity-50';
  return (
    <div className="grid gap-4 rounded-lg border border-fig-100 bg-white p-5 sm:grid-cols-2" data-testid="follow-list">
      <div>
        <h3 className="text-sm font-medium text-ink/70">Varieties</h3>
        <ul className="mt-1 flex flex-col gap-1">
          {varieties.map((v) => (
            <li key={v.varietyId} className="flex items-baseline justify-between gap-2">
              <VarietyLink id={v.varietyId} name={v.name} />
              <button type="button" className={stop} disabled={mutation.isPending} onClick={() => mutation.mutate({ unfollowVariety: v.varietyId })} aria-label={`Stop following ${v.name}`}>
                Stop
              </button>
            </li>
          ))}
          {varieties.length === 0 && <li className="text-sm text-ink/70">None.</li>}
        </ul>
      </div>
      <div>
        <h3 className="text-sm font-medium text-ink/70">Places</h3>
        <ul className="mt-1 flex flex-col gap-1">
          {places.map((p) => (
            <li key={p.id} className="flex items-baseline justify-between gap-2">
              <Link to={`/here?${new URLSearchParams({ lat: String(p.lat), lon: String(p.lon) })}`} className="font-medium text-fig-700 underline">
                {p.name}
              </Link>
              <button type="button" className={stop} disabled={mutation.isPending} onClick={() => mutation.mutate({ unfollowPlace: p.id })} aria-label={`Stop following ${p.name}`}>
                Stop
              </button>
            </li>
          ))}
          {places.length === 0 && <li className="text-sm text-ink/70">None.</li>}
        </ul>
      </div>
      <p className="text-xs text-ink/70 sm:col-span-2">Their news comes in your weekly digest, when it is on.</p>
    </div>
  );
}
