import type Database from 'better-sqlite3';
import { accuracyOf, chanceMethod, leaveOneGrowerOut, VALIDATION_RADIUS_KM } from '../../shared/domain/chance-model';
import type { ModelAccuracy } from '../../shared/schemas/accuracy';
import { readModelInputs } from '../atlas/chance-data';
import type { StationSnapshot } from '../stations/station-snapshot';

export const ACCURACY_METHOD =
  'Leave-one-grower-out cross-validation: for every grower, the model is fitted again without their reports and ' +
  'predicts each of their tree-seasons (at the tree’s public grid cell, in its growing form, with the other growers’ trees ' +
  `within ${VALIDATION_RADIUS_KM} km as local evidence). Compared with (b) the variety’s overall rate of edible-crop seasons and (c) the ` +
  'adjusted share the atlas ranked by before, both also without that grower. Brier score: mean squared difference between ' +
  'forecast and outcome (Brier 1950); log loss: mean of −ln(probability given to what happened); lower is better for both. ' +
  `Model: ${chanceMethod(VALIDATION_RADIUS_KM / 2)}`;

/** Reads the reports and cross-validates the chance (pure work: a worker thread runs it on a large atlas). */
export function computeModelAccuracy(sqlite: Database.Database, stations: StationSnapshot, computedAt: string): ModelAccuracy {
  const inputs = readModelInputs(sqlite, stations);
  const predictions = leaveOneGrowerOut(inputs.records, inputs.varieties);
  const summary = accuracyOf(predictions);
  const growers = new Set(inputs.records.filter((r) => r.seasons > 0).map((r) => r.userId)).size;
  return {
    status: 'ready',
    computedAt,
    treeSeasons: summary?.treeSeasons ?? 0,
    trees: summary?.trees ?? 0,
    growers,
    demoShare: inputs.seasons > 0 ? inputs.demoSeasons / inputs.seasons : 0,
    scores: summary?.scores ?? null,
    brierSkillScore: summary?.brierSkillScore ?? null,
    bins: summary?.bins ?? [],
    method: ACCURACY_METHOD,
  };
}
