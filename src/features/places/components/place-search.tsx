import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useId, useState, type KeyboardEvent, type ReactNode } from 'react';
import type { Place } from '@shared/schemas/places';
import { placeSearchQueries, useHomePlace, type NearPoint } from '../api';

function useDebounced<T>(value: T, ms: number): T {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setDebounced(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return debounced;
}

/** "Albany, NY, United States": a town with where it is, for messages and the chosen place. */
export function placeLabel(place: Place): string {
  return place.context ? `${place.name}, ${place.context}` : place.name;
}

/**
 * Resolve typed text to its best match (the first answer of the same search the list shows), for a
 * form submitted while its town box still holds text nobody picked: the text is used, not dropped.
 */
export function useResolvePlace(near?: NearPoint | null) {
  const queryClient = useQueryClient();
  const home = useHomePlace();
  const bias = near === undefined ? home : near;
  return useCallback(
    async (text: string): Promise<Place | null> => {
      if (text.trim().length < 2) return null;
      const answer = await queryClient.fetchQuery(placeSearchQueries.search(text, bias));
      return answer.places[0] ?? null;
    },
    [queryClient, bias],
  );
}

interface PlaceSearchProps {
  /** Called with the town picked from the list, or the best match of text submitted with Enter. */
  onPick: (place: Place) => void;
  /** Rank towns near this point first; left out, the signed-in grower's home place (if any). */
  near?: NearPoint | null;
  label?: string;
  /** Show the label only to screen readers (the atlas's floating box). */
  hideLabel?: boolean;
  hint?: ReactNode;
  placeholder?: string;
  /** Told whenever the box holds text that is not a picked town (null when it does not). */
  onPendingText?: (text: string | null) => void;
  /** Buttons beside the box (the atlas's "Use my location"). */
  trailing?: ReactNode;
  /** The atlas's floating look instead of a form field. */
  floating?: boolean;
}

/**
 * The one town search of the app (the server's embedded gazetteer; nothing leaves the machine),
 * a combobox in the WAI-ARIA pattern: typing lists matches, nearest and largest first; Arrow keys
 * move, Enter picks the highlighted town (or, with the list closed, the best match of the text),
 * Escape closes the list and then clears the text. Text left in the box without a pick is flagged
 * beside it with its best match, never silently dropped.
 */
export function PlaceSearch({ onPick, near, label = 'Find a town', hideLabel = false, hint, placeholder = 'e.g. Albany', onPendingText, trailing, floating = false }: PlaceSearchProps) {
  const id = useId();
  const listId = `${id}-list`;
  const home = useHomePlace();
  const bias = near === undefined ? (home ? { lat: home.lat, lon: home.lon } : null) : near;
  const resolve = useResolvePlace(bias);
  const [text, setText] = useState('');
  const [picked, setPicked] = useState<string | null>(null);
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const [focused, setFocused] = useState(false);
  const [notFound, setNotFound] = useState<string | null>(null);
  const q = useDebounced(text.trim(), 200);
  const search = useQuery(placeSearchQueries.search(q, bias));
  const places = q.length >= 2 ? (search.data?.places ?? []) : [];
  const pending = text.trim().length >= 2 && text !== picked ? text.trim() : null;
  const listOpen = open && q.length >= 2 && pending !== null;

  useEffect(() => onPendingText?.(pending), [pending, onPendingText]);

  const choose = (place: Place) => {
    onPick(place);
    setText(place.name);
    setPicked(place.name);
    setOpen(false);
    setNotFound(null);
  };

  const resolveTyped = async () => {
    if (!pending) return;
    const best = places[0] && q === pending ? places[0] : await resolve(pending).catch(() => null);
    if (best) choose(best);
    else setNotFound(pending);
  };

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'ArrowDown') {
      e.preventDefault();
      if (!open) setOpen(true);
      else setActive((i) => Math.min(places.length - 1, i + 1));
    } else if (e.key === 'ArrowUp') {
      e.preventDefault();
      setActive((i) => Math.max(0, i - 1));
    } else if (e.key === 'Enter') {
      // Enter never submits the surrounding form with a town half typed.
      if (!pending) return;
      e.preventDefault();
      if (listOpen && places[active]) choose(places[active]);
      else void resolveTyped();
    } else if (e.key === 'Escape') {
      if (listOpen) {
        e.preventDefault();
        setOpen(false);
      } else if (text) {
        e.preventDefault();
        setText('');
        setPicked(null);
        setNotFound(null);
      }
    }
  };

  const best = places[0];
  const showFlag = pending !== null && !focused && !search.isFetching;
  const flagId = `${id}-flag`;
  const hintId = hint ? `${id}-hint` : undefined;

  return (
    <div className={`relative flex min-w-0 flex-col gap-1 ${floating ? 'pointer-events-auto max-w-sm flex-1' : ''}`}>
      <label htmlFor={id} className={hideLabel ? 'sr-only' : 'text-sm font-medium text-ink'}>
        {label}
      </label>
      <div className={floating ? 'flex gap-2 rounded-lg border border-fig-100 bg-paper/95 p-1.5 shadow-sm backdrop-blur' : 'flex gap-2'}>
        <input
          id={id}
          type="search"
          role="combobox"
          aria-expanded={listOpen}
          aria-controls={listId}
          aria-autocomplete="list"
          aria-activedescendant={listOpen && places[active] ? `${listId}-${places[active].id}` : undefined}
          aria-describedby={[hintId, showFlag ? flagId : null].filter(Boolean).join(' ') || undefined}
          aria-invalid={showFlag && notFound === pending ? true : undefined}
          autoComplete="off"
          placeholder={placeholder}
          value={text}
          onChange={(e) => {
            setText(e.target.value);
            setOpen(true);
            setActive(0);
            setNotFound(null);
          }}
          onFocus={() => {
            setFocused(true);
            setOpen(true);
          }}
          onBlur={() => {
            setFocused(false);
            setTimeout(() => setOpen(false), 150);
          }}
          onKeyDown={onKeyDown}
          className={
            floating
              ? 'min-w-0 flex-1 rounded-md border border-fig-200 bg-white px-3 py-1.5 text-base focus:border-fig-500 focus:outline-none sm:text-sm'
              : 'min-w-0 flex-1 rounded-md border border-fig-200 bg-white px-3 py-2 text-base shadow-sm focus:border-fig-500 focus:outline-none aria-invalid:border-red-600'
          }
        />
        {trailing}
      </div>
      {hint && (
        <p id={hintId} className={`text-xs text-ink/70 ${floating ? 'sr-only' : ''}`}>
          {hint}
        </p>
      )}
      {listOpen && (
        <ul id={listId} role="listbox" aria-label="Matching towns" className={`absolute left-0 right-0 top-full z-20 mt-1 max-h-72 overflow-y-auto rounded-lg border border-fig-100 bg-white py-1 text-sm shadow-lg`}>
          {search.isPending && (
            <li role="presentation" className="px-3 py-2 text-ink/70">
              Searching…
            </li>
          )}
          {search.isError && (
            <li role="presentation" className="px-3 py-2 text-red-700">
              Town search is not available right now.
            </li>
          )}
          {search.isSuccess && places.length === 0 && (
            <li role="presentation" className="px-3 py-2 text-ink/70">
              No town of that name in the gazetteer.
            </li>
          )}
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
      <div aria-live="polite">
        {showFlag && (
          <p id={flagId} data-testid="place-search-flag" className={`rounded-md px-2 py-1 text-sm ${floating ? 'bg-paper/95 shadow-sm' : ''} ${notFound === pending || (search.isSuccess && !best) ? 'text-red-700' : 'bg-amber-soft/30 text-ink'}`}>
            {notFound === pending || (search.isSuccess && !best) ? (
              <>No town called “{pending}” was found: check the spelling, or pick a spot another way.</>
            ) : (
              <>
                “{pending}” is not chosen yet.{' '}
                {best && (
                  <button type="button" className="font-medium text-fig-700 underline" onClick={() => choose(best)}>
                    Use {placeLabel(best)}
                  </button>
                )}
              </>
            )}
          </p>
        )}
      </div>
    </div>
  );
}
