import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { LABELS } from '@shared/domain/codes';
import { Button } from '../../../components/button';
import { savedPlaceQueries, useDeletePlace, useSavePlace, useUpdatePlace } from '../api';
import { PlaceSearch } from './place-search';

/** Add a saved place from the town search (named after the town; rename it later by saving again). */
function AddPlace() {
  const save = useSavePlace();
  return (
    <div className="mt-3 flex flex-col gap-1">
      <PlaceSearch
        label="Add a place by town"
        hint="Saved with the town's name, in the ground; open it in What ripens here to save a garden's own spot."
        onPick={(place) => save.mutate({ name: `${place.name}, ${place.context}`.slice(0, 80), lat: place.lat, lon: place.lon, form: 'ground', isHome: false })}
      />
      {save.isSuccess && (
        <p role="status" className="text-sm text-leaf-700">
          Saved “{save.data.place.name}”.
        </p>
      )}
      {save.error && (
        <p role="alert" className="text-sm text-red-700">
          {save.error.message}
        </p>
      )}
    </div>
  );
}

/** The grower's saved places on the account page: open, make home, delete, add by town. */
export function SavedPlaceList() {
  return (
    <>
      <SavedPlaces />
      <AddPlace />
    </>
  );
}

function SavedPlaces() {
  const { data, isLoading, error } = useQuery(savedPlaceQueries.list());
  const update = useUpdatePlace();
  const remove = useDeletePlace();
  if (isLoading) return <p className="text-ink/70">Loading your places…</p>;
  if (error) return <p className="text-red-700">{error.message}</p>;
  if (!data || data.places.length === 0)
    return (
      <p className="text-sm text-ink/80">
        No saved places yet. Open{' '}
        <Link to="/here" className="font-medium text-fig-600 underline">
          What ripens here
        </Link>{' '}
        and choose “Save this place”.
      </p>
    );
  return (
    <ul className="flex flex-col divide-y divide-fig-50 rounded-lg border border-fig-100 bg-white" aria-label="Saved places">
      {data.places.map((p) => (
        <li key={p.id} className="flex flex-wrap items-center gap-3 px-4 py-3">
          <div className="min-w-0 flex-1">
            <p className="font-medium">
              {p.name} {p.isHome && <span className="ml-1 rounded bg-leaf-100 px-1.5 text-xs text-leaf-700">home</span>}
            </p>
            <p className="text-xs text-ink/70">
              {p.lat.toFixed(3)}, {p.lon.toFixed(3)} · {LABELS.growingForm[p.form]}
            </p>
          </div>
          <Link className="text-sm font-medium text-fig-600 underline" to={`/here?${new URLSearchParams({ lat: String(p.lat), lon: String(p.lon), form: p.form })}`}>
            What ripens here
          </Link>
          {!p.isHome && (
            <Button type="button" variant="quiet" className="!px-2 !py-1" disabled={update.isPending} onClick={() => update.mutate({ id: p.id, isHome: true })}>
              Make home
            </Button>
          )}
          <Button type="button" variant="quiet" className="!px-2 !py-1" disabled={remove.isPending} onClick={() => remove.mutate(p.id)} aria-label={`Delete ${p.name}`}>
            Delete
          </Button>
        </li>
      ))}
    </ul>
  );
}
