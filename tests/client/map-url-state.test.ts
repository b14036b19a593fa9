import { describe, expect, it } from 'vitest';
import { OUTCOME_RING_COLORS, ringSteps } from '../../src/features/map/pin-rings';
import { SEASON_RAMP } from '../../src/features/map/palette';
import { seasonColor } from '../../src/features/map/season-surface';
import { atlasUrlParams, parseAtlasUrl, toBbox } from '../../src/features/map/url-state';

describe('the atlas URL', () => {
  it('round-trips filters, layers and the view, so a shared link opens the same map', () => {
    const state = {
      filters: { varietyId: 7, figType: 'common' as const, crop: 'main' as const, outcome: 'ripened' as const, form: 'container' as const, seasonFrom: 2022, seasonTo: 2025 },
      layers: ['wasp' as const, 'frost' as const],
      view: { lat: 42.6526, lon: -73.7562, zoom: 9.5 },
    };
    const params = atlasUrlParams(state);
    expect(params.toString()).toBe('variety=7&type=common&crop=main&outcome=ripened&form=container&from=2022&to=2025&layers=wasp%2Cfrost&lat=42.6526&lon=-73.7562&zoom=9.50');
    expect(parseAtlasUrl(params)).toEqual(state);
  });

  it('drops unknown or malformed values instead of failing', () => {
    const parsed = parseAtlasUrl(new URLSearchParams('crop=winter&type=giant&variety=abc&from=20x&layers=wasp,bees&lat=200&lon=0&zoom=3'));
    expect(parsed).toEqual({ filters: {}, layers: ['wasp'], view: null });
  });

  it('puts seasons the right way round', () => {
    expect(parseAtlasUrl(new URLSearchParams('from=2025&to=2021')).filters).toEqual({ seasonFrom: 2021, seasonTo: 2025 });
  });
});

describe('the viewport as a bbox', () => {
  it('rounds outward to a tenth of a degree', () => {
    expect(toBbox(-74.04, 42.51, -73.52, 42.86)).toBe('-74.1,42.5,-73.5,42.9');
  });

  it('wraps a view across the 180th meridian into west > east', () => {
    expect(toBbox(170, -30, 190, -10)).toBe('170.0,-30.0,-170.0,-10.0');
  });

  it('asks for the whole world when the view spans it', () => {
    expect(toBbox(-250, -80, 200, 80)).toBe('-180.0,-80.0,180.0,80.0');
  });
});

/** WCAG 2.x relative luminance of an sRGB colour (W3C, "relative luminance" in the WCAG 2.1 glossary). */
function luminance([r, g, b]: [number, number, number]): number {
  const lin = (c: number) => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}
const hex = (h: string): [number, number, number] => [1, 3, 5].map((k) => parseInt(h.slice(k, k + 2), 16)) as [number, number, number];

describe('the season surface palette', () => {
  it('darkens steadily with the season length, so it reads in order without telling hues apart', () => {
    // A sequential scale stays readable to colour-blind viewers when its lightness is monotonic
    // (Brewer, "Color use guidelines for mapping", 1994; recalled from memory).
    let previous = Number.POSITIVE_INFINITY;
    for (let days = 60; days <= 360; days += 5) {
      const l = luminance(seasonColor(days));
      expect(l, `${days} days`).toBeLessThan(previous + 1e-9);
      previous = l;
    }
    expect(seasonColor(90)).toEqual(hex(SEASON_RAMP[0]!.color));
    expect(seasonColor(400)).toEqual(hex(SEASON_RAMP[SEASON_RAMP.length - 1]!.color));
  });
});

describe('the pins’ outcome rings', () => {
  it('shares the ring in 24ths, ripened first, never more than the whole', () => {
    expect(ringSteps(4, 2, 1)).toEqual({ ripened: 12, unripe: 6, other: 6 });
    expect(ringSteps(3, 3, 0)).toEqual({ ripened: 24, unripe: 0, other: 0 });
    expect(ringSteps(3, 1, 2)).toEqual({ ripened: 8, unripe: 16, other: 0 });
    expect(ringSteps(0, 0, 0)).toEqual({ ripened: 0, unripe: 0, other: 24 });
  });

  it('keeps the three parts apart by lightness (WCAG contrast of at least 2 between neighbours)', () => {
    // Contrast ratio (L1 + 0.05) / (L2 + 0.05), WCAG 2.1 definition.
    const contrast = (a: string, b: string) => {
      const [l1, l2] = [luminance(hex(a)), luminance(hex(b))].sort((x, y) => y - x);
      return (l1! + 0.05) / (l2! + 0.05);
    };
    expect(contrast(OUTCOME_RING_COLORS.ripened, OUTCOME_RING_COLORS.unripe)).toBeGreaterThan(2);
    expect(contrast(OUTCOME_RING_COLORS.unripe, OUTCOME_RING_COLORS.other)).toBeGreaterThan(2);
    expect(contrast(OUTCOME_RING_COLORS.ripened, OUTCOME_RING_COLORS.other)).toBeGreaterThan(3);
  });
});
