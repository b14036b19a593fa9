import type Database from 'better-sqlite3';
import { GROWING_FORMS, type GrowingForm } from '../../shared/domain/codes';
import { fitChanceModel, type ChanceModel, type ModelVariety, type TreeRecord, type VarietyCoefficients } from '../../shared/domain/chance-model';
import type { StationSnapshot } from '../stations/station-snapshot';
import { readModelInputs } from './chance-data';

/*
 * The fitted chance model of one data version, and its tree records as typed-array columns sorted by
 * tree id, so the near answer finds the records of its local trees by binary search and the whole
 * thing crosses from the worker thread without a copy.
 */

/** The atlas and stations data versions as one number (the fit depends on both). */
export function chanceFitVersion(atlas: number, stations: number): number {
  return atlas * 1_000_000 + stations;
}

export interface RecordColumns {
  count: number;
  treeId: Int32Array;
  userId: Int32Array;
  varietyId: Int32Array;
  form: Uint8Array;
  lat: Float64Array;
  lon: Float64Array;
  /** NaN where the typical season at the cell is unknown. */
  localDays: Float64Array;
  seasons: Int32Array;
  edible: Int32Array;
  reports: Int32Array;
  ripened: Int32Array;
  /**
   * Row of each tree id's first record, by tree id (−1: none), when tree ids are dense enough (SQLite's
   * row ids usually are) for a direct table; empty otherwise, and rows are found by binary search.
   */
  firstRowOfTree: Int32Array;
}

export interface ChanceFitData {
  version: number;
  classes: ChanceModel['classes'];
  placeSpread: number;
  varieties: [number, VarietyCoefficients][];
  columns: RecordColumns;
}

export interface ChanceFit {
  version: number;
  model: ChanceModel;
  columns: RecordColumns;
}

export function computeChanceFit(sqlite: Database.Database, stations: StationSnapshot, version: number): { data: ChanceFitData; transfer: ArrayBuffer[] } {
  const { records, varieties } = readModelInputs(sqlite, stations);
  const model = fitChanceModel(records, varieties);
  const sorted = [...records].sort((a, b) => a.treeId - b.treeId);
  const n = sorted.length;
  const c: RecordColumns = {
    count: n,
    treeId: new Int32Array(n),
    userId: new Int32Array(n),
    varietyId: new Int32Array(n),
    form: new Uint8Array(n),
    lat: new Float64Array(n),
    lon: new Float64Array(n),
    localDays: new Float64Array(n),
    seasons: new Int32Array(n),
    edible: new Int32Array(n),
    reports: new Int32Array(n),
    ripened: new Int32Array(n),
    firstRowOfTree: new Int32Array(0),
  };
  const maxTreeId = n > 0 ? sorted[n - 1]!.treeId : 0;
  if (maxTreeId <= 4 * n + 1024) {
    c.firstRowOfTree = new Int32Array(maxTreeId + 1).fill(-1);
    for (let i = n - 1; i >= 0; i--) c.firstRowOfTree[sorted[i]!.treeId] = i;
  }
  sorted.forEach((r, i) => {
    c.treeId[i] = r.treeId;
    c.userId[i] = r.userId;
    c.varietyId[i] = r.varietyId;
    c.form[i] = GROWING_FORMS.indexOf(r.form);
    c.lat[i] = r.lat;
    c.lon[i] = r.lon;
    c.localDays[i] = r.localDays ?? NaN;
    c.seasons[i] = r.seasons;
    c.edible[i] = r.edible;
    c.reports[i] = r.reports;
    c.ripened[i] = r.ripened;
  });
  const transfer = Object.values(c).filter((v): v is ArrayBufferView => ArrayBuffer.isView(v)).map((v) => v.buffer as ArrayBuffer);
  return { data: { version, classes: model.classes, placeSpread: model.placeSpread, varieties: [...model.varieties], columns: c }, transfer };
}

export function chanceFitFrom(data: ChanceFitData): ChanceFit {
  return { version: data.version, model: { classes: data.classes, placeSpread: data.placeSpread, varieties: new Map(data.varieties) }, columns: data.columns };
}

/** The records of these trees for one variety (the trees' grid cells, never their exact places). */
export function recordsOf(fit: ChanceFit, treeIds: Iterable<number>, variety: Pick<ModelVariety, 'id'>): TreeRecord[] {
  const c = fit.columns;
  const out: TreeRecord[] = [];
  const direct = c.firstRowOfTree.length > 0;
  for (const treeId of treeIds) {
    let lo = 0;
    if (direct) {
      lo = treeId < c.firstRowOfTree.length ? c.firstRowOfTree[treeId]! : -1;
      if (lo < 0) continue;
    } else {
      let hi = c.count;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (c.treeId[mid]! < treeId) lo = mid + 1;
        else hi = mid;
      }
    }
    for (let i = lo; i < c.count && c.treeId[i] === treeId; i++) {
      if (c.varietyId[i] !== variety.id) continue;
      const days = c.localDays[i]!;
      out.push({
        treeId,
        userId: c.userId[i]!,
        varietyId: variety.id,
        form: GROWING_FORMS[c.form[i]!] as GrowingForm,
        lat: c.lat[i]!,
        lon: c.lon[i]!,
        localDays: Number.isNaN(days) ? null : days,
        seasons: c.seasons[i]!,
        edible: c.edible[i]!,
        reports: c.reports[i]!,
        ripened: c.ripened[i]!,
      });
    }
  }
  return out;
}
