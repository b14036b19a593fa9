import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvRowToCandidate, EXPORT_COLUMNS, IMPORT_COLUMNS, importTemplateCsv, publicRowsToGeoJson, unknownColumns } from '../../shared/domain/report-csv';
import { createReportInputSchema } from '../../shared/schemas/reports';

describe('report CSV', () => {
  it('has a template whose example row passes the shared schema once the variety is resolved', () => {
    const parsed = Papa.parse<Record<string, string>>(importTemplateCsv(), { header: true, skipEmptyLines: true });
    expect(parsed.meta.fields).toEqual(IMPORT_COLUMNS.map((c) => c.name));
    const { candidate, errors } = csvRowToCandidate(parsed.data[0]!, 2);
    expect(errors).toEqual([]);
    expect(candidate.varietyName).toBe('Lantern Amber');
    expect(createReportInputSchema.safeParse({ ...candidate.input, varietyId: 1 }).success).toBe(true);
  });

  it('names the cell that is not a number or not yes/no', () => {
    const { errors } = csvRowToCandidate({ lat: '42,6', lon: '-73.7', pinched: 'maybe', season: '2024' }, 7);
    expect(errors).toEqual([
      { line: 7, column: 'lat', message: '“42,6” is not a number' },
      { line: 7, column: 'pinched', message: 'Write yes or no' },
    ]);
  });

  it('spots unknown columns', () => {
    expect(unknownColumns(['lat', 'lon', 'Season', 'crop'])).toEqual(['Season']);
  });

  it('makes GeoJSON points in [longitude, latitude] order from the grid only', () => {
    const row = { reportId: 1, treeId: 2, variety: 'X', varietyStatus: 'accepted', figType: 'common', season: 2024, crop: 'main', outcome: 'ripened', form: 'ground', origin: 'cutting', yearPlanted: null, gridLat: 42.675, gridLon: -73.775, firstRipeDate: null, lastHarvestDate: null, springFrostDate: null, fallFrostDate: null, pinched: false } as const;
    const geo = publicRowsToGeoJson([row]);
    // RFC 7946, section 3.1.1: a position is longitude, then latitude.
    expect(geo.features[0]!.geometry.coordinates).toEqual([-73.775, 42.675]);
    expect(Object.keys(geo.features[0]!.properties)).not.toContain('gridLat');
    expect(EXPORT_COLUMNS).not.toContain('lat' as never);
  });
});
