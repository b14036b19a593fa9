import { describe, expect, it } from 'vitest';
import { buildFitResponse, buildNearResponse, type VarietyInfo } from '../../shared/domain/evidence';
import type { EvidenceReport } from '../../shared/domain/ripening-stats';
import { groupTreeEvidence, varietyOverall } from '../../shared/domain/ripening-stats';
import { estimateSeason } from '../../shared/domain/season-estimate';
import { fitResponseSchema, nearResponseSchema } from '../../shared/schemas/atlas';

let nextId = 1;
const r = (over: Partial<EvidenceReport>): EvidenceReport => ({
  reportId: nextId++,
  treeId: 1,
  userId: 1,
  varietyId: 1,
  crop: 'main',
  form: 'ground',
  outcome: 'ripened',
  season: 2024,
  distanceKm: 10,
  firstRipeDoy: null,
  springFrostDoy: null,
  ...over,
});

const common: VarietyInfo = { id: 1, name: 'Fictional Amber', figType: 'common', ripeningClass: 'early', isFictional: true, typicalDaysToRipen: null };
const smyrna: VarietyInfo = { id: 2, name: 'Fictional Brass', figType: 'smyrna', ripeningClass: 'mid', isFictional: true, typicalDaysToRipen: 125 };
const season = estimateSeason({
  point: { lat: 42.7, lon: -73.8 },
  stations: [{ id: 1, name: 'Albany', lat: 42.7431, lon: -73.8092, days10: 145, days50: 161, days90: 180, lastSpringDoy50: 119, firstFallDoy50: 285 }],
  reportFrostSeasons: [],
  radiusKm: 100,
});

describe('buildNearResponse', () => {
  it('gives the wire shape, counts trees and growers once, and ranks', () => {
    const amber = [
      r({ varietyId: 1, treeId: 10, userId: 100, season: 2022, springFrostDoy: 120, firstRipeDoy: 235 }),
      r({ varietyId: 1, treeId: 10, userId: 100, season: 2023, springFrostDoy: 118, firstRipeDoy: 240 }),
      r({ varietyId: 1, treeId: 10, userId: 100, season: 2023, crop: 'breba', outcome: 'dropped' }),
      r({ varietyId: 1, treeId: 11, userId: 101, form: 'container', outcome: 'unripe' }),
    ];
    const brass = [r({ varietyId: 2, treeId: 20, userId: 100 }), r({ varietyId: 2, treeId: 21, userId: 102 })];
    const response = buildNearResponse({
      point: { lat: 42.7, lon: -73.8 },
      radiusKm: 100,
      season,
      wasp: { established: false, areas: [] },
      varieties: [
        { variety: smyrna, localTrees: groupTreeEvidence(brass), overall: varietyOverall(groupTreeEvidence(brass)) },
        { variety: common, localTrees: groupTreeEvidence(amber), overall: { share: 0.6, neededDays: null, treesBehindNeed: 0 } },
        { variety: { ...common, id: 3, name: 'Fictional Unreported' }, localTrees: [], overall: { share: null, neededDays: null, treesBehindNeed: 0 } },
      ],
    });
    expect(nearResponseSchema.parse(response)).toEqual(response);
    expect(response.totals).toEqual({ reports: 6, trees: 4, growers: 3 });
    expect(response.varieties.map((v) => v.name)).toEqual(['Fictional Amber', 'Fictional Brass']);
    const [amberEvidence, brassEvidence] = response.varieties;
    // Tree 10: 2 of 3 reports ripened; tree 11: 0 of 1. Two trees, 0.667 ripened.
    expect(amberEvidence.all).toMatchObject({ trees: 2, reports: 4 });
    // 1/3, sent to 4 decimals (ranked on the full figure); the ripened trees to 3.
    expect(amberEvidence.all.share).toBe(0.3333);
    expect(amberEvidence.all.ripened).toBe(0.667);
    expect(amberEvidence.all.interval90!.low).toBe(Math.round(amberEvidence.all.interval90!.low * 1e4) / 1e4);
    expect(amberEvidence.byCrop.breba).toMatchObject({ trees: 1, share: 0 });
    expect(amberEvidence.byForm.container).toMatchObject({ trees: 1, share: 0 });
    expect(amberEvidence.growers).toBe(2);
    expect(amberEvidence.medianFirstRipeDoy).toBe(237.5);
    expect(amberEvidence.medianDaysFrostToRipe).toBe(118.5);
    expect(amberEvidence.seasonFit).toMatchObject({ neededFrom: 'catalogue', neededDays: 110, localSeasonDays: 161, verdict: 'likely' });
    expect(brassEvidence.figType).toBe('smyrna');
    // Given once per fig type: a Smyrna needs the wasp for its crop (Texas A&M EHT-019), absent here.
    expect(response.pollinationByFigType.smyrna!.main.fruitExpected).toBe('no');
    expect(response.pollinationByFigType.common!.main.fruitExpected).toBe('yes');
    expect(Object.keys(response.pollinationByFigType).sort()).toEqual(['common', 'smyrna']);
    expect(brassEvidence.all.share).toBe(1);
    expect(response.method).toMatch(/Gaussian/);
  });
});

describe('buildFitResponse', () => {
  it('gives the fit for a form with the pollination of both crops', () => {
    const fit = buildFitResponse({ variety: smyrna, overall: { share: null, neededDays: null, treesBehindNeed: 0 }, season, waspEstablished: true, form: 'container' });
    expect(fitResponseSchema.parse(fit)).toEqual(fit);
    expect(fit.seasonFit).toMatchObject({ neededDays: 125, headStartDays: 21, marginDays: 161 + 21 - 125, verdict: 'likely' });
    expect(fit.pollination.main.fruitExpected).toBe('yes');
  });
});

describe('the answers’ own words', () => {
  // Every text the engine writes into an answer stays within Latin-1 (one byte per character in a
  // JavaScript string): one character beyond it, such as a typographic apostrophe, makes the whole
  // JSON body a two-byte string, which took the bench's client ~0.8 ms more to decode at 200 km
  // (scripts/bench/near.bench.ts). Names (varieties, stations, areas) are growers' and editors' text
  // and may hold any character.
  const beyondLatin1 = /[^\u0000-\u00ff]/;

  it('uses no character beyond Latin-1 in any season fit, pollination check, reason or method', () => {
    const texts: string[] = [];
    const forms = ['ground', 'container'] as const;
    for (const figType of ['common', 'san-pedro', 'smyrna', 'caprifig', 'unknown'] as const) {
      for (const waspEstablished of [false, true]) {
        const variety: VarietyInfo = { ...common, figType };
        for (const [stations, reports] of [[season.stationCount, 0], [0, 0]] as const) {
          const here = stations ? season : estimateSeason({ point: { lat: 0, lon: 0 }, stations: [], reportFrostSeasons: reports ? [{ distanceKm: 5, seasonDays: 200 }] : [], radiusKm: 50 });
          for (const overall of [{ share: 0.5, neededDays: 140, treesBehindNeed: 9 }, { share: null, neededDays: null, treesBehindNeed: 0 }]) {
            for (const catalogue of [{ typicalDaysToRipen: 120 }, { typicalDaysToRipen: null }, { typicalDaysToRipen: null, ripeningClass: null }]) {
              for (const form of forms) {
                const fit = buildFitResponse({ variety: { ...variety, ...catalogue }, overall, season: here, waspEstablished, form });
                texts.push(fit.seasonFit.explanation, fit.pollination.breba.explanation, fit.pollination.main.explanation, here.method);
              }
            }
          }
        }
        const near = buildNearResponse({
          point: { lat: 42.7, lon: -73.8 },
          radiusKm: 100,
          season,
          wasp: { established: waspEstablished, areas: [] },
          varieties: [{ variety, localTrees: groupTreeEvidence([r({ treeId: 1 }), r({ treeId: 2, outcome: 'unripe' })]), overall: { share: 0.5, neededDays: 200, treesBehindNeed: 9 } }],
        });
        texts.push(near.method, ...near.varieties.map((v) => v.reason));
      }
    }
    expect(texts.filter((t) => beyondLatin1.test(t))).toEqual([]);
  });
});
