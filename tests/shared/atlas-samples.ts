/*
 * Schema-valid sample answers of the regional engine (GET /api/atlas/near, /api/varieties/:id/fit),
 * invented for tests of the guidance screens and rules. Parsed with the contract, so a change of
 * the contract breaks them loudly.
 */
import { fitResponseSchema, nearResponseSchema, type Share, type VarietyEvidence } from '../../shared/schemas/atlas';

const share = (trees: number, ripened: number, low = 0, high = 1): Share => ({ trees, reports: trees * 2, ripened, share: trees ? ripened / trees : null, interval90: trees ? { low, high } : null });
const none = share(0, 0);

const pollination = (figType: VarietyEvidence['figType'], needsWasp: boolean | null, fruitExpected: 'yes' | 'no' | 'uncertain', crop: 'breba' | 'main') => ({
  figType,
  crop,
  needsWasp,
  waspEstablished: false,
  fruitExpected,
  explanation: needsWasp ? 'Its figs fall unless the fig wasp pollinates them, and the wasp is not recorded here.' : 'Sets fruit without pollination.',
});

export const sampleNear = nearResponseSchema.parse({
  point: { lat: 42.65, lon: -73.75 },
  radiusKm: 100,
  form: 'container',
  season: {
    thresholdF: 32,
    days10: 150,
    days50: 166,
    days90: 182,
    lastSpringDoy50: 118,
    firstFallDoy50: 285,
    stationCount: 2,
    reportFrostCount: 14,
    nearestStationKm: 9.4,
    method: 'Inverse-distance weighted mean of station values.',
    stations: [
      { id: 7, name: 'Sample station far', distanceKm: 80, days50: 160, weight: 0.1 },
      { id: 3, name: 'Sample station near', distanceKm: 9.4, days50: 169, weight: 0.9 },
    ],
  },
  wasp: { established: false, areas: [] },
  totals: { reports: 40, trees: 18, growers: 9 },
  method: 'Shares pulled toward each variety’s overall rate when local trees are few.',
  varieties: [
    {
      rank: 1,
      varietyId: 11,
      name: 'Lantern Amber',
      figType: 'common',
      ripeningClass: 'early',
      isFictional: true,
      growers: 5,
      all: share(8, 6, 0.48, 0.9),
      byCrop: { breba: none, main: share(8, 6, 0.48, 0.9) },
      byForm: { ground: share(3, 2), container: share(5, 4), wall: none, greenhouse: none },
      adjustedShare: 0.72,
      overallShare: 0.7,
      medianFirstRipeDoy: 235,
      medianDaysFrostToRipe: 117,
      seasonFit: { verdict: 'likely', form: 'container', localSeasonDays: 166, neededDays: 125, neededFrom: 'reports', headStartDays: 20, marginDays: 61, explanation: 'The season covers its need with room to spare.' },
      chance: { probability: 0.78, low: 0.66, high: 0.87, enoughEvidence: true, trees: 9 },
      reason: 'Ripened on most trees nearby and fits the season.',
    },
    {
      rank: 2,
      varietyId: 17,
      name: 'Terrace Gold',
      figType: 'smyrna',
      ripeningClass: 'late',
      isFictional: true,
      growers: 2,
      all: share(3, 0, 0, 0.5),
      byCrop: { breba: none, main: share(3, 0, 0, 0.5) },
      byForm: { ground: share(3, 0), container: none, wall: none, greenhouse: none },
      adjustedShare: 0.05,
      overallShare: 0.3,
      medianFirstRipeDoy: null,
      medianDaysFrostToRipe: null,
      seasonFit: { verdict: 'unlikely', form: 'container', localSeasonDays: 166, neededDays: 185, neededFrom: 'catalogue', headStartDays: 20, marginDays: 1, explanation: 'Needs a longer season.' },
      chance: { probability: 0, low: 0, high: 0, enoughEvidence: true, trees: 3 },
      reason: 'A Smyrna type: needs the wasp, which is not recorded here.',
    },
  ],
  pollinationByFigType: {
    common: { breba: pollination('common', false, 'yes', 'breba'), main: pollination('common', false, 'yes', 'main') },
    smyrna: { breba: pollination('smyrna', true, 'no', 'breba'), main: pollination('smyrna', true, 'no', 'main') },
  },
});

export const sampleFit = fitResponseSchema.parse({
  variety: { id: 11, name: 'Lantern Amber', figType: 'common' },
  season: sampleNear.season,
  seasonFit: { ...sampleNear.varieties[0]!.seasonFit, verdict: 'marginal', neededDays: 160, marginDays: 26 },
  pollination: sampleNear.pollinationByFigType.common!,
});
