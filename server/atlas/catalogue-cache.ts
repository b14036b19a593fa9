import type { Db } from '../db/client';
import type { VarietyInfo } from '../../shared/domain/evidence';
import { atlasDataVersion } from '../db/data-version';
import { acceptedVarieties } from './atlas.repo';

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
