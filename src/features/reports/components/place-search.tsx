import { useQuery } from '@tanstack/react-query';
import { useEffect, useId, useState } from 'react';
import { placeSearchQueries } from '../../places/api';
import { inputClass } from '../../../components/form-field';

/** Find a town by name (the server's own gazetteer) and move the location there, to refine afterwards. */
export function PlaceSearch({ onPick }: { onPick: (place: { lat: number; lon: number; name: string }) => void }) {
  const id = useId();
  const [text, setText] = useState('');
  const [debounced, setDebounced] = useState('');
  useEffect(() => {
    const timer = setTimeout(() => setDebounced(text.trim()), 250);
    return () => clearTimeout(timer);
  }, [text]);
  const search = useQuery({ ...placeSearchQueries.search(debounced), enabled: debounced.length >= 2 });
  const places = search.data?.places ?? [];
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        Search a town
      </label>
      <input id={id} type="search" className={inputClass} autoComplete="off" placeholder="e.g. Albany" value={text} onChange={(e) => setText(e.target.value)} />
      {places.length > 0 && (
        <ul className="max-h-56 overflow-y-auto rounded-md border border-fig-100 bg-white shadow-sm" aria-label="Matching towns">
          {places.map((place) => (
            <li key={place.id}>
              <button
                type="button"
                className="w-full px-3 py-1.5 text-left text-sm hover:bg-fig-50"
                onClick={() => {
                  onPick({ lat: place.lat, lon: place.lon, name: place.name });
                  setText('');
                }}
              >
                <span className="font-medium">{place.name}</span> <span className="text-ink/70">{place.context}</span>
              </button>
            </li>
          ))}
        </ul>
      )}
      {search.isError && <p className="text-sm text-ink/70">Town search is not available right now; type the coordinates instead.</p>}
      <p className="text-xs text-ink/70">This puts the pin in the town centre; move it to your tree, or type the exact coordinates below.</p>
    </div>
  );
}
