import { describe, expect, it } from 'vitest';
import { FORM_HEAD_START_DAYS, RIPENING_CLASS_NEED_DAYS, seasonFit } from '../../shared/domain/season-fit';
import { seasonFitSchema } from '../../shared/schemas/atlas';

const base = {
  localSeasonDays: 170,
  neededDaysFromReports: null,
  reportsBehindNeed: 0,
  ripeningClass: null,
  typicalDaysToRipen: null,
  form: 'ground' as const,
};

describe('seasonFit', () => {
  it('uses reports when enough trees give the need', () => {
    const fit = seasonFit({ ...base, neededDaysFromReports: 120, reportsBehindNeed: 5, ripeningClass: 'late' });
    expect(fit).toMatchObject({ verdict: 'likely', neededDays: 120, neededFrom: 'reports', marginDays: 50, headStartDays: 0 });
    expect(seasonFitSchema.parse(fit)).toEqual(fit);
    expect(fit.explanation).toMatch(/170 days/);
  });

  it('falls back to the catalogue when reports are few', () => {
    const fit = seasonFit({ ...base, neededDaysFromReports: 100, reportsBehindNeed: 1, ripeningClass: 'mid' });
    expect(fit).toMatchObject({ neededFrom: 'catalogue', neededDays: RIPENING_CLASS_NEED_DAYS.mid });
    expect(seasonFit({ ...base, typicalDaysToRipen: 140, ripeningClass: 'early' })).toMatchObject({ neededDays: 140, neededFrom: 'catalogue' });
  });

  it('calls about 150 frost-free days short for a late main crop (common practice, no source)', () => {
    expect(seasonFit({ ...base, localSeasonDays: 150, ripeningClass: 'late' }).verdict).toBe('unlikely');
    expect(seasonFit({ ...base, localSeasonDays: 150, ripeningClass: 'mid' }).verdict).toBe('marginal');
    expect(seasonFit({ ...base, localSeasonDays: 150, ripeningClass: 'early' }).verdict).toBe('likely');
  });

  it('gives a container its head start, an adjustable assumption (common practice, no source)', () => {
    const ground = seasonFit({ ...base, localSeasonDays: 140, ripeningClass: 'late' });
    const pot = seasonFit({ ...base, localSeasonDays: 140, ripeningClass: 'late', form: 'container' });
    expect(ground.verdict).toBe('unlikely');
    expect(pot).toMatchObject({ headStartDays: FORM_HEAD_START_DAYS.container, marginDays: ground.marginDays! + FORM_HEAD_START_DAYS.container });
    expect(pot.verdict).toBe('marginal');
    expect(pot.explanation).toMatch(/assumed 21-day head start for a container, about 161/);
    expect(seasonFit({ ...base, localSeasonDays: 140, ripeningClass: 'late', form: 'container', headStartDays: 0 }).marginDays).toBe(ground.marginDays);
    expect(FORM_HEAD_START_DAYS.container).toBeGreaterThan(FORM_HEAD_START_DAYS.ground);
  });

  it('says unknown, with reasons, when the season or the need is unknown', () => {
    expect(seasonFit({ ...base, localSeasonDays: null, ripeningClass: 'early' })).toMatchObject({ verdict: 'unknown', marginDays: null, neededDays: 110 });
    const noNeed = seasonFit(base);
    expect(noNeed).toMatchObject({ verdict: 'unknown', neededFrom: 'none', neededDays: null });
    expect(noNeed.explanation).toMatch(/Neither reports nor the catalogue/);
  });
});

describe('seasonFit with heat', () => {
  const late = { neededDaysFromReports: null, reportsBehindNeed: 0, ripeningClass: 'late' as const, typicalDaysToRipen: null, form: 'ground' as const };
  it('says "enough days, too little heat" on a long cool coastal season', () => {
    // Eureka, CA, NOAA 1981-2010 normals near the town: about 306 frost-free days, 1,444 GDD base 50 F.
    const fit = seasonFit({ ...late, localSeasonDays: 306, localHeatF: 1444 });
    expect(fit).toMatchObject({ verdict: 'unlikely', limitedBy: 'heat', localHeatF: 1444, neededHeatF: 2350, neededHeatFrom: 'catalogue', heatMarginF: 1444 - 2350 });
    expect(fit.explanation).toContain('Enough days, too little heat');
  });

  it('says days limit where heat is ample, and both where both fall short', () => {
    expect(seasonFit({ ...late, localSeasonDays: 140, localHeatF: 4000 })).toMatchObject({ verdict: 'unlikely', limitedBy: 'days' });
    expect(seasonFit({ ...late, localSeasonDays: 140, localHeatF: 1500 })).toMatchObject({ verdict: 'unlikely', limitedBy: 'both' });
    expect(seasonFit({ ...late, localSeasonDays: 250, localHeatF: 4000 })).toMatchObject({ verdict: 'likely', limitedBy: null });
  });

  it('judges days alone without heat here (a station without maxima still gives days)', () => {
    expect(seasonFit({ ...late, localSeasonDays: 250, localHeatF: null })).toMatchObject({ verdict: 'likely', limitedBy: null, localHeatF: null, heatMarginF: null });
  });

  it('gives a warm wall more heat than the ground', () => {
    // 2100 x 1.15 = 2415 >= 2350 (FORM_HEAT_FACTOR, an adjustable assumption).
    expect(seasonFit({ ...late, localSeasonDays: 250, localHeatF: 2100, form: 'wall' })).toMatchObject({ verdict: 'marginal', limitedBy: 'heat', heatMarginF: 65 });
  });
});
