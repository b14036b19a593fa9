import { dayOfYear } from './frost';

/*
 * NOAA NCEI U.S. Climate Normals: the station figures the atlas needs (32 °F freeze dates and
 * growing-season length at 50 % and 90 %, annual growing degree days base 50 °F), read from two
 * layouts, both published by NCEI:
 *
 * - 1981-2010 "annual/seasonal product" fixed-width files, one variable per file and one station
 *   per line: an 11-character GHCN id, spaces, the value, one completeness flag letter (C complete,
 *   S standard, R representative, P provisional, Q quasi-normal). Dates are MM/DD. The inventory
 *   `allstations.txt` gives id, latitude, longitude, elevation (m), state, name.
 * - 1991-2020 per-station CSV, one file per station with a header row and columns such as
 *   STATION, LATITUDE, LONGITUDE, ELEVATION, NAME, ANN-TMIN-PRBLST-T32FP50 (dates written MMDD or
 *   MM/DD) and ANN-TMIN-PRBGSL-T32FP50.
 *
 * Special values (NCEI; both read from the data): -6666 where the station never reaches the
 * threshold (tropical stations: the season is the whole year) and -4444 where a freeze can come in
 * any month (high stations: no frost-free season is defined). -9999 (and -7777, -5555, -8888 in
 * NCEI's other products) mean missing or not computed: no value.
 */

/** What the normals say about freezes at a station beyond the dates. */
export type FreezeNote = 'never' | 'any-month' | null;

export const NEVER_FREEZES = -6666;
export const FREEZE_ANY_MONTH = -4444;

export type NormalsValue =
  | { kind: 'value'; value: number; flag: string | null }
  | { kind: 'never' }
  | { kind: 'any-month' }
  | { kind: 'missing' };

/** One station's figures from one normals release. Days of year in a common year (1 January = 1). */
export type NormalsStation = {
  code: string;
  name: string;
  state: string | null;
  lat: number;
  lon: number;
  elevationM: number | null;
  lastSpringDoy50: number | null;
  lastSpringDoy90: number | null;
  firstFallDoy50: number | null;
  firstFallDoy90: number | null;
  /** Growing-season days reached or exceeded in 50 % / 90 % of years (90 % = a short year). */
  seasonDays50: number | null;
  seasonDays90: number | null;
  freezeNote: FreezeNote;
  /** Annual growing degree days, base 50 °F (°F-days). */
  gdd50F: number | null;
  /** Completeness flag of the 50 % season length (C, S, R, P, Q), when given. */
  flag: string | null;
};

/** A value with its optional completeness flag: "04/28S", "163S", "-6666", "2649". */
export function parseNormalsValue(text: string): NormalsValue {
  const m = /^\s*(-?\d{1,5}(?:\.\d+|\/\d{1,2})?)([A-Z])?\s*$/.exec(text);
  if (!m) return { kind: 'missing' };
  const raw = m[1]!;
  if (raw === String(NEVER_FREEZES)) return { kind: 'never' };
  if (raw === String(FREEZE_ANY_MONTH)) return { kind: 'any-month' };
  if (raw.startsWith('-') && Number(raw) <= -5555) return { kind: 'missing' };
  if (raw.includes('/')) {
    const [mm, dd] = raw.split('/').map(Number);
    const doy = dayOfYear(`2001-${String(mm).padStart(2, '0')}-${String(dd).padStart(2, '0')}`);
    return doy === null ? { kind: 'missing' } : { kind: 'value', value: doy, flag: m[2] ?? null };
  }
  return { kind: 'value', value: Number(raw), flag: m[2] ?? null };
}

/** A date written MMDD, MM-DD or MM/DD (the 1991-2020 CSVs; the form recalled from memory) as a day of year; special values pass through. */
export function parseNormalsDate(text: string): NormalsValue {
  const t = text.trim().replace(/^"|"$/g, '');
  const compact = /^(\d{2})-?(\d{2})([A-Z])?$/.exec(t);
  return parseNormalsValue(compact ? `${compact[1]}/${compact[2]}${compact[3] ?? ''}` : t);
}

/** One fixed-width variable file: id → value text (the line after the 11-character id). */
export function readNormalsVariableFile(text: string): Map<string, string> {
  const values = new Map<string, string>();
  for (const line of text.split(/\r?\n/)) {
    if (line.trim() === '') continue;
    values.set(line.slice(0, 11).trim(), line.slice(11));
  }
  return values;
}

export type InventoryEntry = { code: string; lat: number; lon: number; elevationM: number | null; state: string | null; name: string };

/** `allstations.txt`: id, latitude, longitude, elevation, state, name (fixed columns as NCEI writes them). */
export function readNormalsInventory(text: string): Map<string, InventoryEntry> {
  const stations = new Map<string, InventoryEntry>();
  for (const line of text.split(/\r?\n/)) {
    if (line.trim() === '') continue;
    const code = line.slice(0, 11).trim();
    const lat = Number(line.slice(12, 20));
    const lon = Number(line.slice(21, 30));
    const elevation = Number(line.slice(31, 37));
    if (!code || !Number.isFinite(lat) || !Number.isFinite(lon)) continue;
    stations.set(code, {
      code,
      lat,
      lon,
      elevationM: Number.isFinite(elevation) && elevation > -999 ? elevation : null,
      state: line.slice(38, 40).trim() || null,
      name: line.slice(41, 71).trim(),
    });
  }
  return stations;
}

/** The file names of a 1981-2010 set, by the figure each holds. */
export const NORMALS_1981_2010_FILES = {
  inventory: 'allstations.txt',
  lastSpring50: 'ann-tmin-prblst-t32Fp50.txt',
  lastSpring90: 'ann-tmin-prblst-t32Fp90.txt',
  firstFall50: 'ann-tmin-prbfst-t32Fp50.txt',
  firstFall90: 'ann-tmin-prbfst-t32Fp90.txt',
  season50: 'ann-tmin-prbgsl-t32Fp50.txt',
  season90: 'ann-tmin-prbgsl-t32Fp90.txt',
  gdd50: 'ann-grdd-base50.txt',
} as const;

export type NormalsFileKey = keyof typeof NORMALS_1981_2010_FILES;

const valueOf = (v: NormalsValue | undefined) => (v?.kind === 'value' ? v.value : null);

/**
 * Combine a station's values into its record. A -6666 anywhere among the freeze figures means the
 * station never freezes (the season is the whole year, no dates); a -4444 that a freeze can come in
 * any month (no dates; the published length is kept as it is). Neither ever becomes a date.
 */
export function normalsStationFrom(entry: InventoryEntry, v: Partial<Record<Exclude<NormalsFileKey, 'inventory'>, NormalsValue>>): NormalsStation {
  const freezeValues = [v.lastSpring50, v.lastSpring90, v.firstFall50, v.firstFall90, v.season50, v.season90];
  const freezeNote: FreezeNote = freezeValues.some((x) => x?.kind === 'any-month') ? 'any-month' : freezeValues.some((x) => x?.kind === 'never') ? 'never' : null;
  const wholeYear = freezeNote === 'never' ? 365 : null;
  const dates = freezeNote === null;
  return {
    ...entry,
    lastSpringDoy50: dates ? valueOf(v.lastSpring50) : null,
    lastSpringDoy90: dates ? valueOf(v.lastSpring90) : null,
    firstFallDoy50: dates ? valueOf(v.firstFall50) : null,
    firstFallDoy90: dates ? valueOf(v.firstFall90) : null,
    // Kept as published: NCEI gives a length even where the dates are -4444 (Bellemont, AZ: 74
    // days). The estimate does not use it there (server/stations/station-snapshot.ts).
    seasonDays50: valueOf(v.season50) ?? wholeYear,
    seasonDays90: valueOf(v.season90) ?? wholeYear,
    freezeNote,
    gdd50F: valueOf(v.gdd50),
    flag: v.season50?.kind === 'value' ? v.season50.flag : null,
  };
}

export type NormalsParseResult = { stations: NormalsStation[]; errors: string[] };

/**
 * A whole 1981-2010 file set: every station with a 32 °F season or growing degree days that the
 * inventory places. A missing file or a station missing from the inventory is an error naming it.
 */
export function parseNormalsFileSet(files: Partial<Record<NormalsFileKey, string>>): NormalsParseResult {
  const errors: string[] = [];
  for (const [key, name] of Object.entries(NORMALS_1981_2010_FILES)) if (files[key as NormalsFileKey] === undefined) errors.push(`${name}: the file is missing from the set.`);
  if (errors.length) return { stations: [], errors };
  const inventory = readNormalsInventory(files.inventory!);
  const variables = Object.fromEntries(
    (Object.keys(NORMALS_1981_2010_FILES) as NormalsFileKey[]).filter((k) => k !== 'inventory').map((k) => [k, readNormalsVariableFile(files[k]!)]),
  ) as Record<Exclude<NormalsFileKey, 'inventory'>, Map<string, string>>;
  const codes = new Set<string>();
  for (const map of Object.values(variables)) for (const code of map.keys()) codes.add(code);
  const stations: NormalsStation[] = [];
  for (const code of [...codes].sort()) {
    const entry = inventory.get(code);
    if (!entry) {
      errors.push(`${code}: not in ${NORMALS_1981_2010_FILES.inventory}, so it has no place.`);
      continue;
    }
    const values: Partial<Record<Exclude<NormalsFileKey, 'inventory'>, NormalsValue>> = {};
    for (const [key, map] of Object.entries(variables)) {
      const text = map.get(code);
      if (text !== undefined) values[key as Exclude<NormalsFileKey, 'inventory'>] = parseNormalsValue(text);
    }
    stations.push(normalsStationFrom(entry, values));
  }
  return { stations, errors };
}

/** Columns of the 1991-2020 per-station CSV that the atlas reads. */
export const NORMALS_CSV_COLUMNS = {
  lastSpring50: 'ANN-TMIN-PRBLST-T32FP50',
  lastSpring90: 'ANN-TMIN-PRBLST-T32FP90',
  firstFall50: 'ANN-TMIN-PRBFST-T32FP50',
  firstFall90: 'ANN-TMIN-PRBFST-T32FP90',
  season50: 'ANN-TMIN-PRBGSL-T32FP50',
  season90: 'ANN-TMIN-PRBGSL-T32FP90',
  gdd50: 'ANN-GRDD-BASE50',
} as const;

/**
 * One 1991-2020 per-station CSV (header row, then the station's annual row). Needs STATION,
 * LATITUDE, LONGITUDE and at least the 50 % season length; errors name the column.
 */
export function parseNormalsStationCsv(rows: Record<string, string>[], fileName: string): { station: NormalsStation | null; errors: string[] } {
  const errors: string[] = [];
  const row = rows.find((r) => (r[NORMALS_CSV_COLUMNS.season50] ?? '').trim() !== '') ?? rows[0];
  if (!row) return { station: null, errors: [`${fileName}: the file has no data row.`] };
  const code = (row.STATION ?? '').trim();
  const lat = Number(row.LATITUDE);
  const lon = Number(row.LONGITUDE);
  if (!code) errors.push(`${fileName}, column STATION: the station id is missing.`);
  if (!(row.LATITUDE ?? '').trim() || !Number.isFinite(lat) || lat < -90 || lat > 90) errors.push(`${fileName}, column LATITUDE: “${row.LATITUDE ?? ''}” is not a latitude.`);
  if (!(row.LONGITUDE ?? '').trim() || !Number.isFinite(lon) || lon < -180 || lon > 180) errors.push(`${fileName}, column LONGITUDE: “${row.LONGITUDE ?? ''}” is not a longitude.`);
  const values: Partial<Record<Exclude<NormalsFileKey, 'inventory'>, NormalsValue>> = {};
  for (const [key, column] of Object.entries(NORMALS_CSV_COLUMNS)) {
    const text = row[column];
    if (text === undefined || text.trim() === '') continue;
    const parsed = key.startsWith('last') || key.startsWith('first') ? parseNormalsDate(text) : parseNormalsValue(text.trim().replace(/^"|"$/g, ''));
    if (parsed.kind === 'missing' && !/^-\d+/.test(text.trim())) errors.push(`${fileName}, column ${column}: “${text.trim()}” is not a value.`);
    values[key as Exclude<NormalsFileKey, 'inventory'>] = parsed;
  }
  if (values.season50 === undefined) errors.push(`${fileName}, column ${NORMALS_CSV_COLUMNS.season50}: the 50 % growing-season length is missing.`);
  if (errors.length) return { station: null, errors };
  const elevation = Number(row.ELEVATION);
  const entry: InventoryEntry = {
    code,
    lat,
    lon,
    elevationM: (row.ELEVATION ?? '').trim() !== '' && Number.isFinite(elevation) ? elevation : null,
    state: null,
    name: (row.NAME ?? code).trim(),
  };
  return { station: normalsStationFrom(entry, values), errors };
}

/** "frost-free all year" / "no frost-free season defined": the words for the special values. */
export function freezeNoteWords(note: FreezeNote): string | null {
  if (note === 'never') return 'frost-free all year (the normals record no freeze)';
  if (note === 'any-month') return 'no frost-free season defined (a freeze can come in any month)';
  return null;
}
