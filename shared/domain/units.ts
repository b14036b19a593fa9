import { z } from 'zod';

/*
 * Units and dates as the grower reads them. The API and the database stay in SI and ISO dates
 * (km, °F thresholds as the climate normals name them, 'YYYY-MM-DD'); only what is shown passes
 * through here. One date style everywhere: Intl's "medium" date (e.g. "Dec 3, 2026" in en-US,
 * "3 Dec 2026" in en-GB), and a day of the year as month and day ("Apr 29" / "29 Apr").
 */

export const TEMPERATURE_UNITS = ['F', 'C'] as const;
export const DISTANCE_UNITS = ['km', 'mi'] as const;
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];
export type DistanceUnit = (typeof DISTANCE_UNITS)[number];

export const unitPrefsSchema = z.object({
  temperature: z.enum(TEMPERATURE_UNITS, { message: 'temperature must be F or C' }),
  distance: z.enum(DISTANCE_UNITS, { message: 'distance must be km or mi' }),
  /** A BCP 47 tag for dates (the browser's language when the grower saved). */
  locale: z
    .string()
    .trim()
    .max(35, { message: 'locale must have at most 35 characters' })
    .refine((tag) => isSupportedLocale(tag), { message: 'locale must be a language tag such as en-US' }),
});
export type UnitPrefs = z.infer<typeof unitPrefsSchema>;

/** 1 international mile = 1.609344 km exactly (NIST Handbook 44, Appendix C). */
export const KM_PER_MILE = 1.609344;

export const kmToMiles = (km: number) => km / KM_PER_MILE;
export const milesToKm = (miles: number) => miles * KM_PER_MILE;
export const fahrenheitToCelsius = (f: number) => ((f - 32) * 5) / 9;
/** A temperature difference (degree-days, a margin): no offset. */
export const fahrenheitSpanToCelsius = (f: number) => (f * 5) / 9;

export function isSupportedLocale(tag: string): boolean {
  if (!tag) return false;
  try {
    return Intl.DateTimeFormat.supportedLocalesOf([tag]).length > 0;
  } catch {
    return false;
  }
}

/*
 * Where people read °F and miles by default. °F: the United States and its territories, Liberia,
 * the Bahamas, Belize, Palau, the Cayman Islands, Micronesia and the Marshall Islands (common
 * practice, no source). Miles on road signs: the US, the UK and Liberia (recalled from memory).
 */
const FAHRENHEIT_REGIONS = new Set(['US', 'PR', 'GU', 'VI', 'AS', 'MP', 'UM', 'LR', 'BS', 'BZ', 'PW', 'KY', 'FM', 'MH']);
const MILE_REGIONS = new Set(['US', 'PR', 'GU', 'VI', 'AS', 'MP', 'UM', 'GB', 'LR']);

function regionOf(locale: string): string | null {
  try {
    const loc = new Intl.Locale(locale);
    return (loc.region ?? loc.maximize().region ?? null)?.toUpperCase() ?? null;
  } catch {
    return null;
  }
}

function isWellFormedLocale(tag: string): boolean {
  try {
    return Intl.getCanonicalLocales(tag).length === 1;
  } catch {
    return false;
  }
}

const defaultsByLocale = new Map<string, UnitPrefs>();

/**
 * The units a browser's language suggests ("en-US" → °F and miles, "fr-FR" → °C and km). Worked out
 * once per language: every component that shows a unit asks on every render.
 */
export function defaultUnitsForLocale(locale: string): UnitPrefs {
  let prefs = defaultsByLocale.get(locale);
  if (!prefs) {
    // A browser's own language is a well-formed tag, checked here by syntax alone: asking for
    // date-format support as well would load that data for the first screen, which shows no date.
    const safe = isWellFormedLocale(locale) ? locale : 'en-US';
    const region = regionOf(safe);
    prefs = {
      temperature: region && FAHRENHEIT_REGIONS.has(region) ? 'F' : 'C',
      distance: region && MILE_REGIONS.has(region) ? 'mi' : 'km',
      locale: safe,
    };
    defaultsByLocale.set(locale, prefs);
  }
  return prefs;
}

const trimZero = (v: number, digits: number) => {
  const rounded = Number(v.toFixed(digits));
  return Object.is(rounded, -0) ? 0 : rounded;
};

/** A temperature the API gives in °F, in the grower's unit: "28 °F" or "-2.2 °C". */
export function formatTemperature(valueF: number, prefs: Pick<UnitPrefs, 'temperature'>): string {
  if (prefs.temperature === 'F') return `${trimZero(valueF, 1)} °F`;
  return `${trimZero(fahrenheitToCelsius(valueF), 1)} °C`;
}

/** A distance the API gives in km: "100 km" or "62 mi" (whole units unless asked). */
export function formatDistance(km: number, prefs: Pick<UnitPrefs, 'distance'>, digits = 0): string {
  const value = prefs.distance === 'km' ? km : kmToMiles(km);
  return `${trimZero(value, digits)} ${prefs.distance}`;
}

/** The short unit word: "km" or "mi". */
export const distanceUnitLabel = (prefs: Pick<UnitPrefs, 'distance'>) => prefs.distance;

/** Radius choices, round in the grower's unit; the value sent stays in km. */
export function radiusChoices(prefs: Pick<UnitPrefs, 'distance'>): { km: number; label: string }[] {
  if (prefs.distance === 'km') return [25, 50, 100, 200, 300].map((km) => ({ km, label: `${km} km` }));
  return [15, 30, 60, 125, 185].map((mi) => ({ km: Math.round(milesToKm(mi) * 1000) / 1000, label: `${mi} mi` }));
}

/** A round scale-bar length in the grower's unit that fits in maxKm: { km, label }. */
export function scaleBarLength(maxKm: number, prefs: Pick<UnitPrefs, 'distance'>): { km: number; label: string } {
  const maxInUnit = prefs.distance === 'km' ? maxKm : kmToMiles(maxKm);
  const pow = 10 ** Math.floor(Math.log10(Math.max(maxInUnit, 1e-9)));
  const step = [5, 2, 1].map((m) => m * pow).find((v) => v <= maxInUnit) ?? pow;
  return { km: prefs.distance === 'km' ? step : milesToKm(step), label: `${step} ${prefs.distance}` };
}

const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

/** A calendar date ('YYYY-MM-DD') or an ISO timestamp in the one medium style. Calendar dates are read in UTC so they never shift by a day. */
export function formatDate(iso: string | null | undefined, locale: string): string {
  if (!iso) return '—';
  const calendar = ISO_DAY.test(iso);
  const ms = Date.parse(calendar ? `${iso}T12:00:00Z` : iso);
  if (Number.isNaN(ms)) return iso;
  return new Intl.DateTimeFormat(locale, { dateStyle: 'medium', ...(calendar ? { timeZone: 'UTC' } : {}) }).format(ms);
}

/** A moment (ISO timestamp) with the time: the medium date and a short time. */
export function formatDateTime(iso: string | null | undefined, locale: string): string {
  if (!iso) return '—';
  const ms = Date.parse(iso);
  if (Number.isNaN(ms)) return iso;
  return new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeStyle: 'short' }).format(ms);
}

/** A day of the year (1..365, read on a common year) as month and day: "Apr 29" or "29 Apr". */
export function formatDayOfYear(doy: number | null | undefined, locale: string): string {
  if (doy === null || doy === undefined || !Number.isFinite(doy)) return '—';
  return new Intl.DateTimeFormat(locale, { month: 'short', day: 'numeric', timeZone: 'UTC' }).format(Date.UTC(2025, 0, Math.round(doy)));
}

/** "1 tree", "3 trees": never "1 trees". */
export function plural(count: number, one: string, many = `${one}s`): string {
  return `${count} ${Math.abs(count) === 1 ? one : many}`;
}
