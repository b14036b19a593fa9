import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { GrowingForm } from '@shared/domain/codes';
import { Button } from '../../../components/button';
import { savedPlaceQueries } from '../../places/api';
import { PlaceSearch, placeLabel } from '../../places/components/place-search';

export interface PickedWhere {
  lat: number;
  lon: number;
  /** The growing form saved with a saved place, to fill the form's own choice. */
  form?: GrowingForm;
}

/**
 * Three quick ways to say where the tree stands, for a grower with a phone in the garden: the
 * phone's own location, their home garden (saved places), or a town; the small map then opens there
 * to place the pin exactly.
 */
export function WherePicker({ onPlace }: { onPlace: (where: PickedWhere) => void }) {
  const saved = useQuery(savedPlaceQueries.list());
  const places = saved.data?.places ?? [];
  const home = places.find((p) => p.isHome);
  const [status, setStatus] = useState<string | null>(null);

  const useMyLocation = () => {
    if (!('geolocation' in navigator)) {
      setStatus('This browser cannot tell its location: use your home garden or search a town.');
      return;
    }
    setStatus('Finding you…');
    navigator.geolocation.getCurrentPosition(
      (pos) => {
        onPlace({ lat: pos.coords.latitude, lon: pos.coords.longitude });
        setStatus(`Placed at your location (to within about ${Math.round(pos.coords.accuracy)} m). Move the pin if the tree stands elsewhere.`);
      },
      (err) => setStatus(err.code === err.PERMISSION_DENIED ? 'Location was not allowed: use your home garden or search a town.' : 'Your location could not be found: use your home garden or search a town.'),
      { enableHighAccuracy: true, timeout: 20_000, maximumAge: 60_000 },
    );
  };

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap gap-2" role="group" aria-label="Quick places">
        <Button type="button" variant="secondary" onClick={useMyLocation}>
          <span aria-hidden>◎</span> Use my location
        </Button>
        {home && (
          <Button
            type="button"
            variant="secondary"
            onClick={() => {
              onPlace({ lat: home.lat, lon: home.lon, form: home.form });
              setStatus(`Placed at your home garden, “${home.name}”. Move the pin to the tree itself.`);
            }}
          >
            <span aria-hidden>⌂</span> My home garden
          </Button>
        )}
        {places
          .filter((p) => !p.isHome)
          .map((p) => (
            <Button
              key={p.id}
              type="button"
              variant="quiet"
              className="border border-fig-100"
              onClick={() => {
                onPlace({ lat: p.lat, lon: p.lon, form: p.form });
                setStatus(`Placed at “${p.name}”. Move the pin to the tree itself.`);
              }}
            >
              {p.name}
            </Button>
          ))}
      </div>
      {!home && saved.isSuccess && <p className="text-xs text-ink/70">Save your garden as your home place (What ripens here → Save this place) and it appears here.</p>}
      <PlaceSearch
        label="Or search a town"
        hint="This puts the pin in the town centre; move it to your tree, or type the exact coordinates below."
        onPick={(place) => {
          onPlace({ lat: place.lat, lon: place.lon });
          setStatus(`Placed in ${placeLabel(place)}. Move the pin to the tree itself.`);
        }}
      />
      <p role="status" className="text-sm text-leaf-700 empty:hidden">
        {status}
      </p>
    </div>
  );
}
