import { useState } from 'react';
import type { Place } from '@shared/schemas/places';
import { PlaceSearch as TownSearch } from '../../places/components/place-search';
import type { MapView } from '../url-state';

/** Zoom for a town: larger towns get a wider view. */
function zoomForPlace(place: Place): number {
  return place.population > 1_000_000 ? 9 : place.population > 100_000 ? 10 : 11;
}

/**
 * The atlas's town box: the app's one town search (nearest the map's centre first), floating over
 * the map, and the browser's own location beside it.
 */
export function PlaceSearch({ onGo, center }: { onGo: (view: MapView) => void; center: { lat: number; lon: number } }) {
  const [locating, setLocating] = useState<string | null>(null);

  const useMyLocation = () => {
    if (!('geolocation' in navigator)) {
      setLocating('This browser cannot tell its location.');
      return;
    }
    setLocating('Finding you…');
    navigator.geolocation.getCurrentPosition(
      (pos) => {
        setLocating(null);
        onGo({ lat: pos.coords.latitude, lon: pos.coords.longitude, zoom: 9 });
      },
      (err) => setLocating(err.code === err.PERMISSION_DENIED ? 'Location was not allowed; search for your town instead.' : 'Your location could not be found.'),
      { enableHighAccuracy: false, timeout: 15_000, maximumAge: 600_000 },
    );
  };

  return (
    <div className="pointer-events-auto relative min-w-0 max-w-sm flex-1">
      <TownSearch
        floating
        hideLabel
        label="Find a town"
        placeholder="Find a town…"
        near={center}
        onPick={(place: Place) => onGo({ lat: place.lat, lon: place.lon, zoom: zoomForPlace(place) })}
        trailing={
          <button type="button" onClick={useMyLocation} className="shrink-0 rounded-md px-2.5 py-1.5 text-sm font-medium text-fig-700 hover:bg-fig-50" title="Use my location">
            <span aria-hidden>◎</span>
            <span className="sr-only sm:not-sr-only sm:ml-1">Use my location</span>
          </button>
        }
      />
      {locating && (
        <p role="status" className="mt-1 rounded-md bg-paper/95 px-2 py-1 text-xs text-ink/80 shadow-sm">
          {locating}
        </p>
      )}
    </div>
  );
}
