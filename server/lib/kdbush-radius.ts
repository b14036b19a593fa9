import type KDBush from 'kdbush';
import { boundingBox, type LatLon } from '../../shared/domain/geo';

/**
 * The ids of a kdbush index's points (built over lon, lat) inside the boxes that hold every place
 * within `radiusKm` of the point (boundingBox: split at the antimeridian, whole circles of longitude
 * near the poles), each id once. The caller applies the exact great-circle distance.
 */
export function idsInRadiusBoxes(index: KDBush, point: LatLon, radiusKm: number): number[] {
  const boxes = boundingBox(point, radiusKm);
  if (boxes.length === 1) {
    const box = boxes[0]!;
    return index.range(box.minLon, box.minLat, box.maxLon, box.maxLat);
  }
  // Boxes either side of the antimeridian touch at +-180: a point there would be found twice.
  const found = new Set<number>();
  for (const box of boxes) for (const i of index.range(box.minLon, box.minLat, box.maxLon, box.maxLat)) found.add(i);
  return [...found];
}
