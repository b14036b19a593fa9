import type { Outcome } from './codes';
import { dayOfYear, median } from './guidance';

/*
 * The pure part of a variety's page: its grid cells with trees that ripened or failed, and the
 * days its trees needed from the last spring frost to the first ripe fig.
 */

export interface VarietyReportRow {
  treeId: number;
  gridLat: number;
  gridLon: number;
  outcome: Outcome;
}

/**
 * One row per public grid cell: trees with at least one ripened report count as ripened, trees
 * whose every report ended without ripe figs count as failed (a tree counts once, however many
 * seasons it was reported).
 */
export function cellsOf(rows: VarietyReportRow[]): { gridLat: number; gridLon: number; ripenedTrees: number; failedTrees: number }[] {
  const trees = new Map<number, { gridLat: number; gridLon: number; ripened: boolean }>();
  for (const r of rows) {
    const seen = trees.get(r.treeId);
    // A tree whose reports sit in two cells (a moved container) is drawn where it last ripened or was first seen.
    if (!seen) trees.set(r.treeId, { gridLat: r.gridLat, gridLon: r.gridLon, ripened: r.outcome === 'ripened' });
    else if (r.outcome === 'ripened' && !seen.ripened) trees.set(r.treeId, { gridLat: r.gridLat, gridLon: r.gridLon, ripened: true });
  }
  const cells = new Map<string, { gridLat: number; gridLon: number; ripenedTrees: number; failedTrees: number }>();
  for (const t of trees.values()) {
    const key = `${t.gridLat},${t.gridLon}`;
    const cell = cells.get(key) ?? { gridLat: t.gridLat, gridLon: t.gridLon, ripenedTrees: 0, failedTrees: 0 };
    if (t.ripened) cell.ripenedTrees++;
    else cell.failedTrees++;
    cells.set(key, cell);
  }
  return [...cells.values()].sort((a, b) => a.gridLat - b.gridLat || a.gridLon - b.gridLon);
}

/** Nearest-rank percentile of sorted values (p in 0..1). */
function nearestRank(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1))]!;
}

/**
 * Days from the last spring frost to the first ripe fig, for reports that gave both dates within a
 * year of each other (a first-ripe date before the frost date is a typo and is left out): the median and
 * the 10th-90th percentile range (nearest rank).
 */
export function daysNeededOf(rows: { springFrostDate: string | null; firstRipeDate: string | null }[]): { reports: number; median: number | null; low: number | null; high: number | null } {
  const days: number[] = [];
  for (const r of rows) {
    if (!r.springFrostDate || !r.firstRipeDate) continue;
    if (dayOfYear(r.springFrostDate) === null || dayOfYear(r.firstRipeDate) === null) continue;
    const span = Math.round((Date.parse(`${r.firstRipeDate}T00:00:00Z`) - Date.parse(`${r.springFrostDate}T00:00:00Z`)) / 86_400_000);
    // A season spans at most a year (southern seasons cross the new year, so dates are compared, not days of year).
    if (span <= 0 || span >= 366) continue;
    days.push(span);
  }
  days.sort((x, y) => x - y);
  if (days.length === 0) return { reports: 0, median: null, low: null, high: null };
  return { reports: days.length, median: median(days), low: nearestRank(days, 0.1), high: nearestRank(days, 0.9) };
}
