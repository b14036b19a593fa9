import { describe, expect, it } from 'vitest';
import { cropNeedsWasp, diagnose, questionsFor } from '../../shared/domain/diagnosis';
import type { CauseCode } from '../../shared/schemas/diagnosis';

const codes = (causes: { code: CauseCode }[]) => causes.map((c) => c.code);

describe('questionsFor', () => {
  it('asks only what matters for each branch', () => {
    // common practice, no source: pinching matters for ripening, plant origin for a tree that never fruits
    expect(questionsFor('unripe')).toContain('pinching');
    expect(questionsFor('unripe')).not.toContain('origin');
    expect(questionsFor('no-fruit')).toContain('origin');
    expect(questionsFor('no-fruit')).not.toContain('pinching');
    expect(questionsFor('dropped')).toContain('watering');
    for (const s of ['no-fruit', 'dropped', 'unripe'] as const) expect(questionsFor(s)).toContain('place');
  });
});

describe('cropNeedsWasp', () => {
  it('follows the four fig types', () => {
    // Texas A&M AgriLife EHT-019 "Figs"; Condit 1955, Hilgardia 23(11): common sets alone, Smyrna needs
    // caprification, San Pedro breba sets alone but its main crop needs the wasp.
    expect(cropNeedsWasp('common', 'main')).toBe(false);
    expect(cropNeedsWasp('smyrna', 'main')).toBe(true);
    expect(cropNeedsWasp('san-pedro', 'breba')).toBe(false);
    expect(cropNeedsWasp('san-pedro', 'main')).toBe(true);
    expect(cropNeedsWasp('san-pedro', 'unsure')).toBeNull();
    expect(cropNeedsWasp('unknown', 'main')).toBeNull();
  });
});

describe('diagnose: no fruit formed', () => {
  it('puts a young seedling’s juvenility first', () => {
    // common practice, no source: trees from seed stay juvenile for several years
    const causes = diagnose({ symptom: 'no-fruit', origin: 'seedling', treeAgeYears: 2, sun: 'full', feeding: 'balanced', watering: 'even' });
    expect(causes[0]!.code).toBe('juvenile-plant');
    expect(codes(causes)).toContain('young-tree');
    expect(causes[0]!.likelihood).toBe('high');
  });

  it('names a small tissue-culture plant as juvenile too', () => {
    // common practice, no source
    const causes = diagnose({ symptom: 'no-fruit', origin: 'tissue-culture', treeAgeYears: 1 });
    expect(causes[0]!.code).toBe('juvenile-plant');
  });

  it('points a young rooted cutting at age, not juvenility', () => {
    // common practice, no source: many varieties take three years or more to bear
    const causes = diagnose({ symptom: 'no-fruit', origin: 'cutting', treeAgeYears: 1, sun: 'full', feeding: 'balanced', watering: 'even' });
    expect(causes[0]!.code).toBe('young-tree');
    expect(codes(causes)).not.toContain('juvenile-plant');
  });

  it('points a mature tree in shade at weakness, and heavy feeding at nitrogen', () => {
    // common practice, no source
    const shaded = diagnose({ symptom: 'no-fruit', origin: 'cutting', treeAgeYears: 6, sun: 'shade', feeding: 'heavy-nitrogen', watering: 'even' });
    expect(codes(shaded).slice(0, 2)).toEqual(['weak-tree', 'too-much-nitrogen']);
    expect(codes(shaded)).not.toContain('young-tree');
  });

  it('falls back to keeping records when nothing stands out', () => {
    const causes = diagnose({ symptom: 'no-fruit', origin: 'cutting', treeAgeYears: 8, sun: 'full', feeding: 'balanced', watering: 'even', figType: 'common' });
    expect(codes(causes)).toEqual(['keep-records']);
  });
});

describe('diagnose: fruit formed, then dropped', () => {
  it('blames pollination for a Smyrna fig where the wasp is absent', () => {
    // Texas A&M EHT-019; Condit 1955: Smyrna figs mature only after caprification
    const causes = diagnose({ symptom: 'dropped', figType: 'smyrna', crop: 'main', treeAgeYears: 5, watering: 'even', feeding: 'balanced' }, { waspEstablished: false });
    expect(causes[0]!.code).toBe('pollination');
    expect(causes[0]!.likelihood).toBe('high');
  });

  it('blames pollination for a San Pedro main crop, not its breba', () => {
    // Texas A&M EHT-019; Condit 1955: San Pedro breba sets alone, main crop drops unless caprified
    const main = diagnose({ symptom: 'dropped', figType: 'san-pedro', crop: 'main', treeAgeYears: 5, watering: 'even', feeding: 'balanced' }, { waspEstablished: false });
    expect(main[0]!.code).toBe('pollination');
    const breba = diagnose({ symptom: 'dropped', figType: 'san-pedro', crop: 'breba', treeAgeYears: 5, watering: 'even', feeding: 'balanced' }, { waspEstablished: false });
    expect(codes(breba)).not.toContain('pollination');
  });

  it('ranks pollination low where the wasp is established', () => {
    const causes = diagnose({ symptom: 'dropped', figType: 'smyrna', crop: 'main', treeAgeYears: 5, watering: 'dry-spells', feeding: 'balanced' }, { waspEstablished: true });
    expect(causes[0]!.code).toBe('water-stress');
    expect(causes.find((c) => c.code === 'pollination')?.likelihood).toBe('low');
  });

  it('points a common fig that dried out at water stress, then nutrition', () => {
    // common practice, no source: dropped fruit on a common fig points first to water stress and poor nutrition
    const causes = diagnose({ symptom: 'dropped', figType: 'common', crop: 'main', treeAgeYears: 4, form: 'container', watering: 'dry-spells', feeding: 'none' }, { waspEstablished: false });
    expect(codes(causes).slice(0, 2)).toEqual(['water-stress', 'poor-nutrition']);
    expect(codes(causes)).not.toContain('pollination');
  });

  it('names root rot when the soil stayed wet', () => {
    // common practice, no source: too much water rots roots
    const causes = diagnose({ symptom: 'dropped', figType: 'common', treeAgeYears: 4, watering: 'soggy', feeding: 'balanced' });
    expect(causes[0]!.code).toBe('water-stress');
    expect(causes[0]!.why).toMatch(/rot/);
  });

  it('raises the unknown type when the wasp is absent', () => {
    const causes = diagnose({ symptom: 'dropped', figType: 'unknown', treeAgeYears: 4, watering: 'even', feeding: 'balanced' }, { waspEstablished: false });
    expect(codes(causes)).toContain('pollination-unknown-type');
  });
});

describe('diagnose: fruit stayed hard and green until frost', () => {
  it('puts the short season first when the engine says the fit is unlikely', () => {
    // common practice, no source: about 150 frost-free days is short for many main crops
    const causes = diagnose({ symptom: 'unripe', form: 'ground', sun: 'full', pinching: 'early-summer', feeding: 'balanced' }, { seasonDays50: 145, seasonFit: 'unlikely', neededDays: 190 });
    expect(causes[0]!.code).toBe('season-too-short');
    expect(causes[0]!.why).toContain('145');
    // common practice, no source: containers warm up sooner and can start earlier
    expect(causes[0]!.tryNext.join(' ')).toMatch(/container/);
  });

  it('adds pinching, with the latex caution, when a short season went unpinched', () => {
    // common practice, no source: pinching tips in early summer brings fruit set forward
    const causes = diagnose({ symptom: 'unripe', form: 'container', sun: 'full', pinching: 'no' }, { seasonDays50: 150 });
    const pinch = causes.find((c) => c.code === 'no-pinching')!;
    expect(pinch.likelihood).toBe('medium');
    expect(pinch.cautions).toContain('latex');
    expect(causes[0]!.code).toBe('season-too-short');
  });

  it('turns to heat and shade when the season is long enough', () => {
    const causes = diagnose({ symptom: 'unripe', form: 'ground', sun: 'shade', pinching: 'early-summer' }, { seasonDays50: 230, seasonFit: 'likely' });
    expect(causes[0]!.code).toBe('not-enough-heat');
    expect(causes.find((c) => c.code === 'season-too-short')?.likelihood).toBe('low');
  });

  it('adds how the variety did nearby', () => {
    const causes = diagnose({ symptom: 'unripe', sun: 'full', pinching: 'early-summer' }, { seasonDays50: 160, varietyTrees: 12, varietyShare: 0.1, seasonFit: 'marginal' });
    expect(codes(causes)).toContain('variety-struggles-here');
    expect(codes(causes)[0]).toBe('season-too-short');
  });

  it('is deterministic and sorted by score', () => {
    const answers = { symptom: 'unripe', form: 'ground', sun: 'part', pinching: 'unsure', feeding: 'heavy-nitrogen' } as const;
    const first = diagnose(answers, { seasonDays50: 155 });
    expect(diagnose(answers, { seasonDays50: 155 })).toEqual(first);
    for (let i = 1; i < first.length; i++) expect(first[i - 1]!.score).toBeGreaterThanOrEqual(first[i]!.score);
  });
});

describe('localDataFrom', () => {
  it('takes the season, wasp status and the variety’s record from the engine’s answers', async () => {
    const { sampleNear, sampleFit } = await import('./atlas-samples');
    const { localDataFrom } = await import('../../shared/domain/diagnosis');
    expect(localDataFrom(sampleNear, sampleFit, 11)).toEqual({
      seasonDays50: 166,
      seasonDays10: 150,
      waspEstablished: false,
      varietyTrees: 8,
      varietyShare: 0.75,
      seasonFit: 'marginal', // the fit endpoint's answer wins over the list's
      neededDays: 160,
      headStartDays: 20,
      limitedBy: null,
      heatF: null,
      extremeMinF: null,
      hardinessZone: null,
    });
    expect(localDataFrom(null, null, null)).toMatchObject({ seasonDays50: null, waspEstablished: null, seasonFit: null });
  });
});

describe('cautions', () => {
  it('puts the fig-sap caution on pruning advice for a San Pedro breba', () => {
    // common practice, no source: fig latex irritates skin and burns it in sunlight
    const causes = diagnose({ symptom: 'dropped', figType: 'san-pedro', crop: 'main', treeAgeYears: 6, watering: 'even', feeding: 'balanced' }, { waspEstablished: false });
    expect(causes[0]!.tryNext.join(' ')).toMatch(/pruning/);
    expect(causes[0]!.cautions).toContain('latex');
  });
});

describe('diagnose with heat and winter cold at the place', () => {
  it('names winter dieback for a lost breba crop where the average coldest night is below what dormant wood survives', () => {
    // Dormant fig wood is hardy to about 12-15 F (California Rare Fruit Growers, "Fig" fruit facts; shared/CHECKS.md).
    const causes = diagnose({ symptom: 'no-fruit', crop: 'breba', form: 'ground' }, { extremeMinF: -5, hardinessZone: '6a' });
    expect(causes[0]).toMatchObject({ code: 'winter-dieback' });
    expect(causes[0]!.why).toContain('zone 6a');
    // A mild winter (20 F average minimum) or a container kept in shelter: not this cause.
    expect(diagnose({ symptom: 'no-fruit', crop: 'breba', form: 'ground' }, { extremeMinF: 20 }).map((c) => c.code)).not.toContain('winter-dieback');
    expect(diagnose({ symptom: 'no-fruit', crop: 'breba', form: 'container' }, { extremeMinF: -5 }).map((c) => c.code)).not.toContain('winter-dieback');
  });

  it('names too little heat where the fit is limited by heat, not days', () => {
    const causes = diagnose({ symptom: 'unripe', crop: 'main', form: 'ground', sun: 'full', warmSpot: true, pinching: 'early-summer' }, { seasonDays50: 300, seasonFit: 'unlikely', limitedBy: 'heat', heatF: 1450 });
    expect(causes[0]).toMatchObject({ code: 'not-enough-heat' });
    expect(causes[0]!.why).toContain('1,450 growing degree days');
  });
});
