import { Router } from 'express';
import { doyLabel, median, shortSeasonVarieties, successBySeason, weeklyHistogram } from '../../shared/domain/guidance';
import {
  ripeDatesQuerySchema,
  ripeDatesResponseSchema,
  seasonSuccessQuerySchema,
  seasonSuccessResponseSchema,
  shortSeasonQuerySchema,
  shortSeasonResponseSchema,
} from '../../shared/schemas/guidance';
import type { Db } from '../db/client';
import { notFound } from '../lib/http-error';
import { findVisibleVariety } from '../varieties/varieties.repo';
import { reportsWithSeason, ripeDatesNear, STATION_SEARCH_KM, varietyBriefs } from './guidance.repo';

const SEASON_METHOD =
  `Each report’s frost-free season is the span between the grower’s own last spring and first fall frost dates for that season; ` +
  `when the grower gave none, the 50 % frost-free days at 32 °F of the nearest station within ${STATION_SEARCH_KM} km. ` +
  'Only reports the season decides are counted (ripened, or still unripe at frost); a tree’s several reports count as one tree.';

/** Public chart data for the guidance pages: aggregates only, never a report's place. */
export function createGuidanceRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/ripe-dates', (req, res) => {
    const q = ripeDatesQuerySchema.parse(req.query);
    // A grower's proposed name is shown only once a published report carries it (drafts stay private).
    const found = findVisibleVariety(db, q.varietyId, req.user);
    if (!found) throw notFound('Variety');
    const variety = { id: found.id, name: found.name, figType: found.figType };
    const { doys, trees } = ripeDatesNear(db, q);
    const mid = median(doys);
    res.json(
      ripeDatesResponseSchema.parse({
        variety,
        radiusKm: q.radiusKm,
        crop: q.crop,
        reports: doys.length,
        trees,
        medianDoy: mid,
        medianLabel: mid === null ? null : doyLabel(mid),
        bins: weeklyHistogram(doys),
      }),
    );
  });

  router.get('/season-success', (req, res) => {
    const q = seasonSuccessQuerySchema.parse(req.query);
    const { rows, withoutSeason, fromOwnFrostDates, fromStations } = reportsWithSeason(db, q);
    res.json(
      seasonSuccessResponseSchema.parse({
        crop: q.crop,
        form: q.form ?? null,
        reports: rows.length,
        withoutSeason,
        fromOwnFrostDates,
        fromStations,
        bins: successBySeason(rows, q.binDays),
        method: `${SEASON_METHOD} Bars: the share of trees that ripened in each ${q.binDays}-day band, with a 90 % Wilson interval.`,
      }),
    );
  });

  router.get('/short-season', (req, res) => {
    const q = shortSeasonQuerySchema.parse(req.query);
    const { rows } = reportsWithSeason(db, { crop: 'main', form: q.form });
    const names = varietyBriefs(db);
    const list = shortSeasonVarieties(rows, q.seasonDays, q.toleranceDays).flatMap((v) => {
      const brief = names.get(v.varietyId);
      return brief ? [{ ...v, ...brief }] : [];
    });
    res.json(
      shortSeasonResponseSchema.parse({
        seasonDays: q.seasonDays,
        toleranceDays: q.toleranceDays,
        form: q.form ?? null,
        varieties: list,
        method: `Main-crop reports from seasons of at most ${Math.round(q.seasonDays + q.toleranceDays)} frost-free days (this season plus ${q.toleranceDays} days). ${SEASON_METHOD}`,
      }),
    );
  });

  return router;
}
