import { Router } from 'express';
import { varietyListQuerySchema, varietyListSchema, varietyResponseSchema } from '../../shared/schemas/varieties';
import type { Db } from '../db/client';
import { notFound } from '../lib/http-error';
import { cellsOf, daysNeededOf } from '../../shared/domain/variety-page';
import { dayOfYear, median, weeklyHistogram } from '../../shared/domain/guidance';
import { varietyPageSchema } from '../../shared/schemas/variety-page';
import { isFollowingVariety } from '../follows/follows.repo';
import { publishedPhotosOfVariety, publishedReportsOfVariety } from './variety-page.repo';
import { findVariety, findVisibleVariety, listVarieties } from './varieties.repo';
import { idParamsSchema } from '../lib/path-params';

/** The variety catalogue: public reads (a grower's proposed name only once a published report carries it). */
export function createVarietiesRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', (req, res) => {
    const query = varietyListQuerySchema.parse(req.query);
    res.json(varietyListSchema.parse({ varieties: listVarieties(db, query, req.user) }));
  });

  // A variety's own page: public figures from published reports, placed by grid cell.
  router.get('/:id/page', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const variety = findVariety(db, id);
    if (!variety || variety.status !== 'accepted') throw notFound('Variety');
    const rows = publishedReportsOfVariety(db, id);
    const cells = cellsOf(rows);
    // Main-crop first-ripe dates, unless the variety is only ever reported for its brebas.
    const crop = rows.some((r) => r.crop === 'main' && r.outcome === 'ripened' && r.firstRipeDate) || !rows.some((r) => r.crop === 'breba') ? 'main' : 'breba';
    const ripe = rows.filter((r) => r.crop === crop && r.outcome === 'ripened' && r.firstRipeDate);
    const doys = ripe.map((r) => dayOfYear(r.firstRipeDate!)).filter((d): d is number => d !== null);
    res.json(
      varietyPageSchema.parse({
        variety,
        totals: {
          reports: rows.length,
          trees: new Set(rows.map((r) => r.treeId)).size,
          growers: new Set(rows.map((r) => r.userId)).size,
          ripenedTrees: cells.reduce((n, c) => n + c.ripenedTrees, 0),
        },
        cells,
        ripeDates: {
          crop,
          reports: doys.length,
          trees: new Set(ripe.map((r) => r.treeId)).size,
          medianDoy: median(doys),
          bins: weeklyHistogram(doys).map(({ week, startDoy, count }) => ({ week, startDoy, count })),
        },
        daysNeeded: daysNeededOf(rows.filter((r) => r.crop === 'main' && r.outcome === 'ripened')),
        photos: publishedPhotosOfVariety(db, id),
        following: req.user ? isFollowingVariety(db, req.user.id, id) : false,
      }),
    );
  });

  router.get('/:id', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const variety = findVisibleVariety(db, id, req.user);
    if (!variety) throw notFound('Variety');
    res.json(varietyResponseSchema.parse({ variety }));
  });

  return router;
}
