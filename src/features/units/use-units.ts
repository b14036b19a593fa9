import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback, useMemo, useSyncExternalStore } from 'react';
import {
  defaultUnitsForLocale,
  formatDate,
  formatDateTime,
  formatDayOfYear,
  formatDistance,
  formatTemperature,
  radiusChoices,
  unitPrefsSchema,
  type UnitPrefs,
} from '@shared/domain/units';
import { unitPrefsResponseSchema } from '@shared/schemas/account-units';
import { apiFetch } from '../../lib/api-client';
import { useCurrentUser } from '../auth/api';

/*
 * The grower's units and date language: saved to the account when signed in, to localStorage for
 * a visitor, and until then what the browser's language suggests. Every temperature, distance and
 * date the client shows goes through useUnits(); the API stays in SI and ISO dates.
 */

const STORAGE_KEY = 'syconium.units';
const listeners = new Set<() => void>();

function readStored(): string | null {
  try {
    return localStorage.getItem(STORAGE_KEY);
  } catch {
    return null;
  }
}

function parseStored(raw: string | null): UnitPrefs | null {
  if (!raw) return null;
  try {
    const parsed = unitPrefsSchema.safeParse(JSON.parse(raw));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}

function storeLocally(prefs: UnitPrefs) {
  try {
    localStorage.setItem(STORAGE_KEY, JSON.stringify(prefs));
  } catch {
    // Private mode without storage: the choice lasts for this page only.
  }
  listeners.forEach((l) => l());
}

const subscribe = (listener: () => void) => {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => e.key === STORAGE_KEY && listener();
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
};

export const browserLocale = () => (typeof navigator !== 'undefined' && navigator.language) || 'en-US';

export const unitQueries = {
  all: ['account-units'] as const,
  mine: () => queryOptions({ queryKey: [...unitQueries.all, 'mine'], queryFn: () => apiFetch('/api/account/units', unitPrefsResponseSchema), staleTime: 5 * 60_000 }),
};

export interface Units {
  prefs: UnitPrefs;
  /** Where the choice comes from: the account, this browser, or the browser's language. */
  source: 'account' | 'browser' | 'default';
  temperature: (valueF: number) => string;
  distance: (km: number, digits?: number) => string;
  date: (iso: string | null | undefined) => string;
  dateTime: (iso: string | null | undefined) => string;
  dayOfYear: (doy: number | null | undefined) => string;
  radiusChoices: { km: number; label: string }[];
  setPrefs: (prefs: UnitPrefs) => void;
}

export function useUnits(): Units {
  const { user } = useCurrentUser();
  const queryClient = useQueryClient();
  const saved = useQuery({ ...unitQueries.mine(), enabled: !!user });
  const storedRaw = useSyncExternalStore(subscribe, readStored, () => null);
  const stored = useMemo(() => parseStored(storedRaw), [storedRaw]);
  const save = useMutation({
    mutationFn: (prefs: UnitPrefs) => apiFetch('/api/account/units', unitPrefsResponseSchema, { method: 'PUT', json: prefs }),
    onSuccess: (data) => queryClient.setQueryData(unitQueries.mine().queryKey, data),
  });
  const account = user ? (saved.data?.units ?? null) : null;
  const prefs = account ?? stored ?? defaultUnitsForLocale(browserLocale());
  const source: Units['source'] = account ? 'account' : stored ? 'browser' : 'default';
  const { mutate } = save;
  const setPrefs = useCallback(
    (next: UnitPrefs) => {
      storeLocally(next);
      if (user) mutate(next);
    },
    [user, mutate],
  );
  return useMemo(
    () => ({
      prefs,
      source,
      temperature: (f: number) => formatTemperature(f, prefs),
      distance: (km: number, digits?: number) => formatDistance(km, prefs, digits),
      date: (iso: string | null | undefined) => formatDate(iso, prefs.locale),
      dateTime: (iso: string | null | undefined) => formatDateTime(iso, prefs.locale),
      dayOfYear: (doy: number | null | undefined) => formatDayOfYear(doy, prefs.locale),
      radiusChoices: radiusChoices(prefs),
      setPrefs,
    }),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [prefs.temperature, prefs.distance, prefs.locale, source, setPrefs],
  );
}
