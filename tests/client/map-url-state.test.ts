import { describe, expect, it } from 'vitest';
import { frostBandFor, FROST_BANDS } from '../../src/features/map/frost-bands';
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

describe('frost-free bands', () => {
  it('places a season length in its band; the Albany normal of 169 days (NCEI 1991-2020, in CHECKS.md) is 150-179', () => {
    expect(frostBandFor(169)?.label).toBe('150–179 days');
    expect(frostBandFor(149)).toBe(FROST_BANDS[0]);
    expect(frostBandFor(240)).toBe(FROST_BANDS[4]);
    expect(frostBandFor(null)).toBeNull();
  });
});
