import path from 'node:path';
import { unzipSync } from 'fflate';
import Papa from 'papaparse';
import {
  NORMALS_1981_2010_FILES,
  NORMALS_CSV_COLUMNS,
  parseNormalsFileSet,
  parseNormalsStationCsv,
  readNormalsInventory,
  type NormalsFileKey,
  type NormalsStation,
} from '../../shared/domain/climate-normals';
import type { BulkImportSummary, BulkStationResult } from '../../shared/schemas/stations';
import { recordAudit } from '../audit/audit.repo';
import type { Db } from '../db/client';
import { HttpError } from '../lib/http-error';
import { writeNormalsRelease, type NormalsRelease } from '../normals/normals.repo';
import { computeStationData } from './station-import';
import { findStationIdByCode, writeStation, type StationData, type StationMeta } from './stations.repo';

/*
 * Editors' bulk imports: one upload of a whole file set, of one of three layouts, recognised by its
 * file names and headers:
 *
 *  - NOAA normals, 1981-2010 fixed-width files (allstations.txt and the ann-*.txt files the atlas
 *    reads; see shared/domain/climate-normals.ts);
 *  - NOAA normals, 1991-2020 per-station CSV files (columns such as ANN-TMIN-PRBLST-T32FP50);
 *  - GHCN-Daily station files (one CSV per station, named by its id) with the inventory
 *    ghcnd-stations.txt, which gives each station's place and name.
 *
 * Files may come loose or in .zip archives (fflate). Every station is read and computed first, with
 * a progress line each; only when the whole set is good is anything written, in one transaction
 * with one audit entry. A bad file refuses the whole set, naming the file and the row or column.
 * A station a newer normals release already gives is refused (kept), and said so.
 */

/** The most an archive may unpack to: a guard against a small zip that expands without end. */
export const BULK_UNPACKED_LIMIT_BYTES = 300 * 1024 * 1024;

export type BulkFile = { name: string; bytes: Uint8Array };
export type BulkProgress = (line: { code: string; index: number; total: number; status: 'read' | 'refused'; message?: string }) => void;

/** Loose files and the contents of any .zip among them, by base name (folders inside a zip are ignored). */
export function expandFiles(files: BulkFile[]): BulkFile[] {
  const out: BulkFile[] = [];
  let unpacked = 0;
  for (const file of files) {
    if (!file.name.toLowerCase().endsWith('.zip')) {
      out.push({ name: path.basename(file.name), bytes: file.bytes });
      continue;
    }
    let entries: Record<string, Uint8Array>;
    try {
      entries = unzipSync(file.bytes, {
        filter: (f) => {
          unpacked += f.originalSize;
          if (unpacked > BULK_UNPACKED_LIMIT_BYTES) throw new HttpError(413, 'file_too_large', `The archives unpack to more than ${BULK_UNPACKED_LIMIT_BYTES / 1024 / 1024} MB`, { files: [`${file.name}: unpacks to more than ${BULK_UNPACKED_LIMIT_BYTES / 1024 / 1024} MB`] });
          return !f.name.endsWith('/') && !path.basename(f.name).startsWith('.');
        },
      });
    } catch (error) {
      if (error instanceof HttpError) throw error;
      throw new HttpError(400, 'invalid_upload', `${file.name} is not a readable .zip archive`, { files: [`${file.name}: not a readable .zip archive`] });
    }
    for (const [name, bytes] of Object.entries(entries)) out.push({ name: path.basename(name), bytes });
  }
  return out;
}

const text = (bytes: Uint8Array) => Buffer.from(bytes).toString('latin1').replace(/^\uFEFF/, '');

export type BulkKind = 'normals-fixed-width' | 'normals-csv' | 'ghcn-daily';

/** Which layout the set is in, from its names and first lines; a clear error when none fits. */
export function detectKind(files: BulkFile[]): BulkKind {
  const names = new Set(files.map((f) => f.name));
  if (Object.values(NORMALS_1981_2010_FILES).some((n) => names.has(n))) return 'normals-fixed-width';
  const csvs = files.filter((f) => f.name.toLowerCase().endsWith('.csv'));
  if (csvs.length > 0 && csvs.every((f) => text(f.bytes.subarray(0, 4096)).split(/\r?\n/)[0]!.toUpperCase().includes(NORMALS_CSV_COLUMNS.season50))) return 'normals-csv';
  if (csvs.length > 0 && names.has('ghcnd-stations.txt')) return 'ghcn-daily';
  const message =
    'The files are not a set the atlas knows: NOAA normals fixed-width files (allstations.txt and ann-*.txt), NOAA 1991-2020 per-station CSV files (with the column ANN-TMIN-PRBGSL-T32FP50), or GHCN-Daily station CSV files with their inventory ghcnd-stations.txt.';
  throw new HttpError(400, 'unknown_file_set', message, { files: [message] });
}

const refuse = (errors: string[]) => {
  const count = errors.length;
  return new HttpError(400, 'invalid_file_set', `Nothing was imported: ${count === 1 ? 'one problem' : `${count} problems`} in the file set.`, { files: errors.slice(0, 200) });
};

/** "1991-2020" → its first and last year; an error naming the field otherwise. */
export function releasePeriod(name: string): { periodStart: number; periodEnd: number } {
  const m = /^(\d{4})-(\d{4})$/.exec(name);
  if (!m || Number(m[2]) <= Number(m[1])) throw new HttpError(400, 'invalid_input', 'The release must be a period such as 1991-2020', { release: ['The release must be a period such as 1991-2020'] });
  return { periodStart: Number(m[1]), periodEnd: Number(m[2]) };
}

/** GHCN-Daily ids in file names: "USW00014735.csv", "ghcnd-USW00014735-daily.csv". */
const ghcnCodeOf = (fileName: string) => fileName.replace(/\.csv$/i, '').replace(/^ghcnd-/i, '').replace(/-daily$/i, '').toUpperCase();

type Prepared =
  | { kind: 'normals-fixed-width' | 'normals-csv'; release: NormalsRelease; stations: NormalsStation[] }
  | { kind: 'ghcn-daily'; stations: { meta: StationMeta; data: StationData }[] };

/**
 * Read and compute the whole set, reporting each station as it is read. Throws (400, every problem
 * listed) before anything is written when any file is bad.
 */
export async function prepareBulkImport(expanded: BulkFile[], kind: BulkKind, fields: { release?: string }, progress: BulkProgress): Promise<Prepared> {
  if (fields.release) releasePeriod(fields.release);
  const source = (release: string) => `NOAA NCEI ${release} U.S. Climate Normals, uploaded by an editor`;

  if (kind === 'normals-fixed-width') {
    const set: Partial<Record<NormalsFileKey, string>> = {};
    for (const [key, name] of Object.entries(NORMALS_1981_2010_FILES)) {
      const file = expanded.find((f) => f.name === name);
      if (file) set[key as NormalsFileKey] = text(file.bytes);
    }
    const parsed = parseNormalsFileSet(set);
    if (parsed.errors.length) throw refuse(parsed.errors);
    const name = fields.release ?? '1981-2010';
    parsed.stations.forEach((s, i) => progress({ code: s.code, index: i + 1, total: parsed.stations.length, status: 'read' }));
    return { kind, release: { name, ...releasePeriod(name), source: source(name), fingerprint: null }, stations: parsed.stations };
  }

  if (kind === 'normals-csv') {
    const csvs = expanded.filter((f) => f.name.toLowerCase().endsWith('.csv'));
    const errors: string[] = [];
    const stations: NormalsStation[] = [];
    csvs.forEach((file, i) => {
      const rows = Papa.parse<Record<string, string>>(text(file.bytes), { header: true, skipEmptyLines: true, transformHeader: (h) => h.trim().toUpperCase() }).data;
      const result = parseNormalsStationCsv(rows, file.name);
      if (result.station) stations.push(result.station);
      errors.push(...result.errors);
      progress({ code: result.station?.code ?? file.name, index: i + 1, total: csvs.length, status: result.station ? 'read' : 'refused', message: result.errors[0] });
    });
    if (errors.length) throw refuse(errors);
    const name = fields.release ?? '1991-2020';
    return { kind, release: { name, ...releasePeriod(name), source: source(name), fingerprint: null }, stations };
  }

  const inventory = readNormalsInventory(text(expanded.find((f) => f.name === 'ghcnd-stations.txt')!.bytes));
  const csvs = expanded.filter((f) => f.name.toLowerCase().endsWith('.csv'));
  const errors: string[] = [];
  const stations: { meta: StationMeta; data: StationData }[] = [];
  for (const [i, file] of csvs.entries()) {
    const code = ghcnCodeOf(file.name);
    const place = inventory.get(code);
    let message: string | undefined;
    if (!place) message = `${file.name}: station ${code} is not in ghcnd-stations.txt, so it has no place.`;
    else {
      try {
        const data = computeStationData(text(file.bytes), undefined, place.lat);
        stations.push({ meta: { name: place.state ? `${place.name}, ${place.state}` : place.name, code, lat: place.lat, lon: place.lon, elevationM: place.elevationM }, data });
      } catch (error) {
        const detail = error instanceof HttpError ? ((error.fields?.file as string[] | undefined)?.slice(0, 5).join(' ') ?? error.message) : String(error);
        message = `${file.name}: ${detail}`;
      }
    }
    if (message) errors.push(message);
    progress({ code, index: i + 1, total: csvs.length, status: message ? 'refused' : 'read', message });
    // Let the progress line go out before the next station's computation.
    await new Promise((resolve) => setImmediate(resolve));
  }
  if (errors.length) throw refuse(errors);
  return { kind, stations };
}

/** Write a prepared set in one transaction with its audit entry; the summary says what became of each station. */
export function writeBulkImport(db: Db, prepared: Prepared, actorId: number | null): BulkImportSummary {
  return db.transaction(() => {
    let results: BulkStationResult[];
    let release: string | null = null;
    if (prepared.kind === 'ghcn-daily') {
      results = prepared.stations.map(({ meta, data }) => {
        const existed = findStationIdByCode(db, meta.code!) !== undefined;
        writeStation(db, meta, data);
        return { code: meta.code!, name: meta.name, status: existed ? 'replaced' : 'added', reason: null };
      });
    } else {
      release = prepared.release.name;
      const summary = writeNormalsRelease(db, prepared.release, prepared.stations, { wholeRelease: prepared.kind === 'normals-fixed-width' });
      const names = new Map(prepared.stations.map((s) => [s.code, s.name]));
      results = [
        ...summary.added.map((code) => ({ code, name: names.get(code) ?? code, status: 'added' as const, reason: null })),
        ...summary.replaced.map((code) => ({ code, name: names.get(code) ?? code, status: 'replaced' as const, reason: null })),
        ...summary.refused.map(({ code, reason }) => ({ code, name: names.get(code) ?? code, status: 'refused' as const, reason })),
      ];
    }
    const counts = { added: 0, replaced: 0, refused: 0 };
    for (const r of results) counts[r.status]++;
    const result: BulkImportSummary = { kind: prepared.kind, release, ...counts, stations: results };
    recordAudit(db, { actorId, action: 'stations.bulk-import', entityType: 'station', entityId: null, before: null, after: { kind: prepared.kind, release, ...counts, codes: results.slice(0, 500).map((r) => `${r.code}:${r.status}`) } });
    return result;
  });
}
