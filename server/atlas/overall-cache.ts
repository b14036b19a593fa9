import type { Db } from '../db/client';
import type { VarietyOverall } from '../../shared/domain/evidence';
import type { VarietyInfo } from '../../shared/domain/evidence';
import { atlasDataVersion } from '../db/data-version';
import { acceptedVarieties, overallFigures } from './atlas.repo';

/**
 * Each variety's rate over all its reports everywhere, which local shares lean toward. It reads every
 * tree row (tree_evidence), so it is kept per database and recomputed only when the data changed. On
 * a large atlas (`LARGE_ATLAS_TREES` trees or more) a changed atlas is re-read at most every
 * `MAX_STALE_MS`: the overall rates may then lag new reports by that much. (At 200,000 reports one
 * computation takes about 30 ms; redone after every write of a stream of posts it took a quarter of
 * the server's CPU. The demo's 800 trees take about 1 ms and are always fresh.)
 */
export const MAX_STALE_MS = 30_000;
export const LARGE_ATLAS_TREES = 10_000;

interface Entry {
  version: number;
  computedAt: number;
  large: boolean;
  overall: Map<number, VarietyOverall>;
}

const cache = new WeakMap<Db, Entry>();

export function overallByVariety(db: Db, now = Date.now()): Map<number, VarietyOverall> {
  const version = atlasDataVersion(db);
  const entry = cache.get(db);
  if (entry && (entry.version === version || (entry.large && now - entry.computedAt < MAX_STALE_MS))) return entry.overall;
  const { overall, trees } = overallFigures(db);
  cache.set(db, { version, computedAt: now, large: trees >= LARGE_ATLAS_TREES, overall });
  return overall;
}

const catalogueCache = new WeakMap<Db, { version: number; varieties: Map<number, VarietyInfo> }>();

/** The accepted varieties, re-read whenever the data may have changed (a small table: no throttle). */
export function cachedAcceptedVarieties(db: Db): Map<number, VarietyInfo> {
  const version = atlasDataVersion(db);
  const entry = catalogueCache.get(db);
  if (entry?.version === version) return entry.varieties;
  const varieties = acceptedVarieties(db);
  catalogueCache.set(db, { version, varieties });
  return varieties;
}
