import { describe, expect, it } from 'vitest';
import { checkDateOrder, checkNeighbourOutlier, checkSeasonFit, distanceKm, findSuspiciousReports, type ReportForRules } from '../../shared/domain/moderation-rules';

const base: ReportForRules = {
  id: 1,
  treeId: 1,
  varietyId: 7,
  lat: 42.65,
  lon: -73.75,
  season: 2024,
  crop: 'main',
  outcome: 'ripened',
  form: 'ground',
  springFrostDate: '2024-04-28',
  firstRipeDate: '2024-09-10',
  lastHarvestDate: '2024-10-05',
  fallFrostDate: '2024-10-12',
  pinchedDate: null,
};
const variety = { id: 7, name: 'Test Black', typicalDaysToRipen: 135 };

describe('distanceKm', () => {
  it('gives about 111.2 km per degree of latitude', () => {
    // 2π · 6371 km / 360 = 111.19 km (mean Earth radius, IUGG; computed by hand)
    expect(distanceKm(40, -75, 41, -75)).toBeCloseTo(111.19, 1);
  });
});

describe('checkDateOrder', () => {
  it('passes a report whose dates run in season order', () => {
    expect(checkDateOrder(base)).toEqual([]);
  });
  it('names a first ripe fig after the last harvest, and a date in another year', () => {
    const [found] = checkDateOrder({ ...base, firstRipeDate: '2024-10-20', springFrostDate: '2023-04-28' });
    expect(found!.rule).toBe('dates-out-of-order');
    expect(found!.message).toContain('the first ripe fig (2024-10-20) comes after the last harvest (2024-10-05)');
    expect(found!.message).toContain('the last spring frost (2023-04-28) is not in the 2024 season');
  });
  it('names a spring frost after the fall frost', () => {
    expect(checkDateOrder({ ...base, springFrostDate: '2024-10-20', firstRipeDate: null, lastHarvestDate: null })[0]!.message).toContain('comes after the first fall frost');
  });
});

describe('checkSeasonFit', () => {
  it('passes a ripening close to the variety’s typical days (135 days here)', () => {
    expect(checkSeasonFit(base, variety)).toEqual([]);
  });
  it('picks out a first ripe fig far sooner than the variety allows', () => {
    // 2024-04-28 to 2024-06-30 = 63 days < 0.6 × 135 = 81
    expect(checkSeasonFit({ ...base, firstRipeDate: '2024-06-30' }, variety)).toEqual([
      { rule: 'too-early', message: 'First ripe 63 days after the spring frost; Test Black typically needs about 135.' },
    ]);
  });
  it('picks out a main crop ripened in the ground in a season far too short, but not in a greenhouse or a container', () => {
    const short = { ...base, firstRipeDate: '2024-08-30', lastHarvestDate: '2024-09-02', fallFrostDate: '2024-09-05' }; // 130-day season < 0.7 × 195
    const late = { ...variety, typicalDaysToRipen: 195 };
    expect(checkSeasonFit(short, late).map((s) => s.rule)).toEqual(['season-too-short']);
    expect(checkSeasonFit({ ...short, form: 'greenhouse' }, late)).toEqual([]);
    expect(checkSeasonFit({ ...short, form: 'container' }, late)).toEqual([]);
  });
  it('says nothing without typical days, or for a breba or a crop that did not ripen', () => {
    expect(checkSeasonFit({ ...base, firstRipeDate: '2024-05-30' }, { ...variety, typicalDaysToRipen: null })).toEqual([]);
    expect(checkSeasonFit({ ...base, firstRipeDate: '2024-05-30', crop: 'breba' }, variety)).toEqual([]);
    expect(checkSeasonFit({ ...base, firstRipeDate: '2024-05-30', outcome: 'unripe' }, variety)).toEqual([]);
  });
});

describe('checkNeighbourOutlier', () => {
  const neighbour = (treeId: number, outcome: ReportForRules['outcome'], dLat = 0.1): ReportForRules => ({ ...base, id: 100 + treeId, treeId, outcome, lat: base.lat + dLat });

  it('picks out a ripened crop where all 6 nearby trees of the variety stayed unripe', () => {
    const others = [2, 3, 4, 5, 6, 7].map((t) => neighbour(t, 'unripe'));
    expect(checkNeighbourOutlier(base, [base, ...others])).toEqual([
      { rule: 'neighbour-outlier', message: 'Ripened, while 6 of 6 nearby main crops of this variety within 60 km did not.' },
    ]);
  });
  it('needs enough neighbours: 4 other trees are too few', () => {
    expect(checkNeighbourOutlier(base, [2, 3, 4, 5].map((t) => neighbour(t, 'unripe')))).toEqual([]);
  });
  it('is quiet when some neighbours ripened too, and ignores far trees, other varieties and the same tree', () => {
    const others = [2, 3, 4, 5, 6].map((t) => neighbour(t, 'unripe'));
    expect(checkNeighbourOutlier(base, [...others, neighbour(8, 'ripened')])).toEqual([]);
    const far = [2, 3, 4, 5, 6].map((t) => neighbour(t, 'unripe', 2)); // 2 degrees ≈ 222 km away
    expect(checkNeighbourOutlier(base, far)).toEqual([]);
    const sameTree = [2, 3, 4, 5].map((t) => neighbour(t, 'unripe')).concat({ ...base, id: 99, outcome: 'unripe' });
    expect(checkNeighbourOutlier(base, sameTree)).toEqual([]);
  });
});

describe('findSuspiciousReports', () => {
  it('finds each report with its reasons, through the grid of neighbours', () => {
    const reports: ReportForRules[] = [
      base,
      ...[2, 3, 4, 5, 6].map((t) => ({ ...base, id: t, treeId: t, outcome: 'unripe' as const, lat: 42.9, lon: -74.1 })), // other grid cells, < 60 km
      { ...base, id: 50, treeId: 50, varietyId: 8, firstRipeDate: '2024-11-01' },
    ];
    const found = findSuspiciousReports(reports, [variety]);
    expect([...found.keys()].sort()).toEqual([1, 50]);
    expect(found.get(1)!.map((s) => s.rule)).toEqual(['neighbour-outlier']);
    expect(found.get(50)!.map((s) => s.rule)).toEqual(['dates-out-of-order']);
  });
});
