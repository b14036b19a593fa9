import { describe, expect, it } from 'vitest';
import { PUBLIC_GRID_STEP_DEG, snapToGrid, toPublicPoint } from '../../shared/domain/public-grid';

describe('public grid', () => {
  it('moves a point to the centre of its 0.05 degree cell', () => {
    expect(toPublicPoint(42.6526, -73.7562)).toEqual({ lat: 42.675, lon: -73.775 });
  });

  it('never moves a point by more than half a cell in each direction', () => {
    for (const value of [-179.99, -33.8688, 0, 0.0249, 51.5072, 179.99]) {
      expect(Math.abs(snapToGrid(value) - value)).toBeLessThanOrEqual(PUBLIC_GRID_STEP_DEG / 2 + 1e-9);
    }
  });

  it('gives every point in a cell the same public position', () => {
    expect(toPublicPoint(42.651, -73.751)).toEqual(toPublicPoint(42.699, -73.799));
  });
});
