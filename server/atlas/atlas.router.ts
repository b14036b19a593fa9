import { Router } from 'express';
import { chanceAt } from '../../shared/domain/chance-model';
import { bandwidthForRadius, buildFitResponse, buildNearResponse, type VarietyEvidenceInput } from '../../shared/domain/evidence';
import { fitQuerySchema, fitResponseSchema, nearQuerySchema, type NearResponse } from '../../shared/schemas/atlas';
import type { Db } from '../db/client';
import { notFound } from '../lib/http-error';
import { findWaspAreasAt } from '../wasp-areas/wasp-areas.repo';
import { cachedAcceptedVarieties } from './catalogue-cache';
import { recordsOf } from './chance-fit';
import { createChanceFitCache } from './chance-fit-cache';
import { createTreeSnapshotCache } from './tree-snapshot-cache';
import { seasonAt } from './season-at';
import { addSeasonSurfaceRoutes } from './season-surface.router';
import { treesWithin, type NearTree } from './tree-snapshot';
import { idParamsSchema } from '../lib/path-params';

const NO_OVERALL = { share: null, neededDays: null, treesBehindNeed: 0 };

function waspAt(db: Db, lat: number, lon: number): NearResponse['wasp'] {
  const areas = findWaspAreasAt(db, lat, lon).map((a) => ({ id: a.id, name: a.name, source: a.source, observedOn: a.observedOn }));
  return { established: areas.length > 0, areas };
}

/**
 * The regional engine's reads: GET /atlas/near and GET /varieties/:id/fit. Mounted on /api before
 * the varieties router, so /varieties/:id/fit never reaches it. Public: answers carry only counts
 * and shares, never a report's place.
 */
export function createAtlasRouter({ db }: { db: Db }): Router {
  const router = Router();
  const snapshots = createTreeSnapshotCache(db);
  const chanceFits = createChanceFitCache(db);

  router.get('/atlas/near', async (req, res) => {
    const query = nearQuerySchema.parse(req.query);
    const point = { lat: query.lat, lon: query.lon };
    const [snapshot, chanceFit] = await Promise.all([snapshots.get(), chanceFits.current()]);
    const trees = treesWithin(snapshot, point, query.radiusKm);
    const season = seasonAt(db, point, query.radiusKm, trees);
    const wasp = waspAt(db, query.lat, query.lon);
    const chanceContext = { point, localDays: season.days50, form: query.form ?? 'ground', waspEstablished: wasp.established, bandwidthKm: bandwidthForRadius(query.radiusKm) };
    const catalogue = cachedAcceptedVarieties(db);
    const overall = snapshot.overall;
    const byVariety = new Map<number, NearTree[]>();
    for (const t of trees) {
      let list = byVariety.get(t.varietyId);
      if (!list) byVariety.set(t.varietyId, (list = []));
      list.push(t);
    }
    const varieties: VarietyEvidenceInput[] = [];
    for (const [id, localTrees] of byVariety) {
      const variety = catalogue.get(id);
      if (!variety) continue;
      // The model's records of these trees: their public grid cells, never the exact places. No fit
      // yet (a large atlas just started): the chance is null, "not computed yet".
      const chance = chanceFit && chanceAt(chanceFit.model, variety, recordsOf(chanceFit, new Set(localTrees.map((t) => t.treeId)), variety), chanceContext);
      varieties.push({ variety, localTrees, overall: overall.get(id) ?? NO_OVERALL, chance });
    }
    const body: NearResponse = buildNearResponse({ point, radiusKm: query.radiusKm, form: query.form, season, wasp, varieties });
    // Typed as NearResponse by the domain function; a runtime parse of this (the hot path) would
    // cost more than the rest of a small query, so the tests parse it instead.
    res.json(body);
  });

  router.get('/varieties/:id/fit', async (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const query = fitQuerySchema.parse(req.query);
    const variety = cachedAcceptedVarieties(db).get(id);
    if (!variety) throw notFound('Variety');
    const point = { lat: query.lat, lon: query.lon };
    const snapshot = await snapshots.get();
    const season = seasonAt(db, point, query.radiusKm, treesWithin(snapshot, point, query.radiusKm));
    const body = buildFitResponse({ variety, overall: snapshot.overall.get(id) ?? NO_OVERALL, season, waspEstablished: waspAt(db, query.lat, query.lon).established, form: query.form });
    res.json(fitResponseSchema.parse(body));
  });

  addSeasonSurfaceRoutes(router, { db, snapshots });
  return router;
}
