import { useQuery } from '@tanstack/react-query';
import { useEffect, useId, useState, type KeyboardEvent } from 'react';
import type { Place } from '@shared/schemas/places';
import { mapQueries } from '../api';
import type { MapView } from '../url-state';

function useDebounced<T>(value: T, ms: number): T {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setDebounced(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return debounced;
}

/** Zoom for a town: larger towns get a wider view. */
function zoomForPlace(place: Place): number {
  return place.population > 1_000_000 ? 9 : place.population > 100_000 ? 10 : 11;
}

/**
 * Find a town by name (the server's embedded gazetteer; nothing leaves the machine) and fly there,
 * or use the browser's own location. A combobox: arrow keys move through the matches, Enter picks.
 */
export function PlaceSearch({ onGo }: { onGo: (view: MapView) => void }) {
  const id = useId();
  const [text, setText] = useState('');
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const [locating, setLocating] = useState<string | null>(null);
  const q = useDebounced(text, 200);
  const search = useQuery(mapQueries.placeSearch(q));
  const places = q.trim().length >= 2 ? (search.data?.places ?? []) : [];
  const listId = `${id}-list`;

  const choose = (place: Place) => {
    onGo({ lat: place.lat, lon: place.lon, zoom: zoomForPlace(place) });
    setText(place.name);
    setOpen(false);
  };

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'ArrowDown') {
      e.preventDefault();
      setOpen(true);
      setActive((i) => Math.min(places.length - 1, i + 1));
    } else if (e.key === 'ArrowUp') {
      e.preventDefault();
      setActive((i) => Math.max(0, i - 1));
    } else if (e.key === 'Enter' && places[active]) {
      e.preventDefault();
      choose(places[active]);
    } else if (e.key === 'Escape') {
      setOpen(false);
    }
  };

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
      <div className="flex gap-2 rounded-lg border border-fig-100 bg-paper/95 p-1.5 shadow-sm backdrop-blur">
        <label htmlFor={id} className="sr-only">
          Find a town
        </label>
        <input
          id={id}
          type="search"
          role="combobox"
          aria-expanded={open && places.length > 0}
          aria-controls={listId}
          aria-autocomplete="list"
          aria-activedescendant={open && places[active] ? `${listId}-${places[active].id}` : undefined}
          autoComplete="off"
          placeholder="Find a town…"
          value={text}
          onChange={(e) => {
            setText(e.target.value);
            setOpen(true);
            setActive(0);
          }}
          onFocus={() => setOpen(true)}
          onBlur={() => setTimeout(() => setOpen(false), 150)}
          onKeyDown={onKeyDown}
          className="min-w-0 flex-1 rounded-md border border-fig-200 bg-white px-3 py-1.5 text-sm focus:border-fig-500 focus:outline-none"
        />
        <button type="button" onClick={useMyLocation} className="shrink-0 rounded-md px-2.5 py-1.5 text-sm font-medium text-fig-700 hover:bg-fig-50" title="Use my location">
          <span aria-hidden>◎</span>
          <span className="sr-only sm:not-sr-only sm:ml-1">Use my location</span>
        </button>
      </div>
      {locating && (
        <p role="status" className="mt-1 rounded-md bg-paper/95 px-2 py-1 text-xs text-ink/80 shadow-sm">
          {locating}
        </p>
      )}
      {open && q.trim().length >= 2 && (
        <ul id={listId} role="listbox" aria-label="Matching towns" className="absolute z-10 mt-1 max-h-72 w-full overflow-y-auto rounded-lg border border-fig-100 bg-white py-1 text-sm shadow-lg">
          {search.isPending && <li className="px-3 py-2 text-ink/70">Searching…</li>}
          {!search.isPending && places.length === 0 && <li className="px-3 py-2 text-ink/70">No town of that name in the gazetteer.</li>}
          {places.map((place, i) => (
            <li
              key={place.id}
              id={`${listId}-${place.id}`}
              role="option"
              aria-selected={i === active}
              onMouseDown={(e) => e.preventDefault()}
              onClick={() => choose(place)}
              onMouseEnter={() => setActive(i)}
              className={`cursor-pointer px-3 py-1.5 ${i === active ? 'bg-fig-50' : ''}`}
            >
              <span className="font-medium text-ink">{place.name}</span> <span className="text-xs text-ink/70">{place.context}</span>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
