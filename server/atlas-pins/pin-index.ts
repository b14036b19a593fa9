import Supercluster, { type ClusterProperties } from 'supercluster';
import type { Bbox, PinFeature } from '../../shared/schemas/pins';

/** One public grid cell with the number of matching reports on it (never an exact spot). */
export interface GridCell {
  gridLat: number;
  gridLon: number;
  reports: number;
  /** How many of them ripened, and how many were still unripe at the end of the season. */
  ripened: number;
  unripe: number;
  /** The report's id when the cell holds exactly one, for a direct link. */
  reportId: number | null;
}

/** A cell's counted row as the grid cell it describes; a cell with one report links to it. */
export function toGridCell(gridLat: number, gridLon: number, reports: number, firstId: number, ripened = 0, unripe = 0): GridCell {
  return { gridLat, gridLon, reports, ripened, unripe, reportId: reports === 1 ? firstId : null };
}

interface CellProps {
  reports: number;
  ripened: number;
  unripe: number;
  reportId: number | null;
}
interface ClusterProps {
  reports: number;
  ripened: number;
  unripe: number;
}

/**
 * Cells cluster at zooms up to CLUSTER_MAX_ZOOM; past it every cell shows on its own. At zoom 11
 * a 0.05-degree cell is about 70 screen pixels wide, so neighbouring cells no longer overlap.
 */
export const CLUSTER_MAX_ZOOM = 10;
export const CLUSTER_RADIUS_PX = 48;

/**
 * The clustered pins of every zoom as flat numbers, ready to answer any view: what a worker thread
 * builds and hands over without copying (`transferList`), and what the request thread queries.
 * `zooms[z]` holds the features of zoom z (0 to CLUSTER_MAX_ZOOM + 1) sorted by longitude,
 * FIELDS numbers each: lon, lat, reports, id (a cluster's id, a single-report cell's report id,
 * else -1), cells (0 for a single cell), expansionZoom (0 for a single cell), ripened and unripe
 * (how many of the reports ripened or stayed unripe: what the pin's ring draws).
 */
export interface PinLayers {
  totalReports: number;
  cellCount: number;
  zooms: Float64Array[];
}
const FIELDS = 8;

export interface PinIndex {
  totalReports: number;
  cellCount: number;
  query: (bbox: Bbox, zoom: number) => PinFeature[];
}

/**
 * Cluster grid cells with supercluster, summing each cluster's reports, and lay out every zoom's
 * result. Works on the coarse public grid only: the input has no exact coordinates, so the output
 * cannot leak any.
 */
export function buildPinLayers(cells: GridCell[]): PinLayers {
  const index = new Supercluster<CellProps, ClusterProps>({
    radius: CLUSTER_RADIUS_PX,
    maxZoom: CLUSTER_MAX_ZOOM,
    minPoints: 2,
    map: (props) => ({ reports: props.reports, ripened: props.ripened, unripe: props.unripe }),
    reduce: (acc, props) => {
      acc.reports += props.reports;
      acc.ripened += props.ripened;
      acc.unripe += props.unripe;
    },
  });
  index.load(
    cells.map((cell) => ({
      type: 'Feature' as const,
      geometry: { type: 'Point' as const, coordinates: [cell.gridLon, cell.gridLat] },
      properties: { reports: cell.reports, ripened: cell.ripened, unripe: cell.unripe, reportId: cell.reportId },
    })),
  );
  const zooms: Float64Array[] = [];
  for (let zoom = 0; zoom <= CLUSTER_MAX_ZOOM + 1; zoom++) {
    const features = index.getClusters([-180, -90, 180, 90], zoom);
    const count = features.length;
    const unsorted = new Float64Array(count * FIELDS);
    for (let i = 0; i < count; i++) {
      const f = features[i]!;
      const k = i * FIELDS;
      const [lon, lat] = f.geometry.coordinates as [number, number];
      // Cluster centres are averages of cell centres; keep them as coarse as the grid.
      unsorted[k] = Math.round(lon * 1e4) / 1e4;
      unsorted[k + 1] = Math.round(lat * 1e4) / 1e4;
      const props = f.properties as Partial<ClusterProperties> & (CellProps | ClusterProps);
      unsorted[k + 2] = props.reports;
      unsorted[k + 6] = props.ripened;
      unsorted[k + 7] = props.unripe;
      if (props.cluster) {
        unsorted[k + 3] = props.cluster_id!;
        unsorted[k + 4] = props.point_count!;
        unsorted[k + 5] = Math.min(CLUSTER_MAX_ZOOM + 1, index.getClusterExpansionZoom(props.cluster_id!));
      } else {
        unsorted[k + 3] = (props as CellProps).reportId ?? -1;
      }
    }
    const order = new Uint32Array(count);
    for (let i = 0; i < count; i++) order[i] = i;
    order.sort((a, b) => unsorted[a * FIELDS]! - unsorted[b * FIELDS]!);
    const layer = new Float64Array(count * FIELDS);
    for (let j = 0; j < count; j++) {
      const from = order[j]! * FIELDS;
      for (let f = 0; f < FIELDS; f++) layer[j * FIELDS + f] = unsorted[from + f]!;
    }
    zooms.push(layer);
  }
  return { totalReports: cells.reduce((sum, cell) => sum + cell.reports, 0), cellCount: cells.length, zooms };
}

/** The first feature of a layer at or east of `lon` (a binary search on the sorted longitudes). */
function firstAtOrEast(layer: Float64Array, lon: number): number {
  let low = 0;
  let high = layer.length / FIELDS;
  while (low < high) {
    const mid = (low + high) >>> 1;
    if (layer[mid * FIELDS]! < lon) low = mid + 1;
    else high = mid;
  }
  return low;
}

function featureAt(layer: Float64Array, i: number): PinFeature {
  const k = i * FIELDS;
  const coordinates: [number, number] = [layer[k]!, layer[k + 1]!];
  const reports = layer[k + 2]!;
  const id = layer[k + 3]!;
  const cells = layer[k + 4]!;
  const ripened = layer[k + 6]!;
  const unripe = layer[k + 7]!;
  if (cells > 0) {
    return { type: 'Feature', geometry: { type: 'Point', coordinates }, properties: { kind: 'cluster', clusterId: id, cells, reports, ripened, unripe, expansionZoom: layer[k + 5]! } };
  }
  return { type: 'Feature', geometry: { type: 'Point', coordinates }, properties: { kind: 'cell', reports, ripened, unripe, reportId: id < 0 ? null : id } };
}

/** Answers views from prepared layers: a binary search on longitude, then a latitude check. */
export function pinIndexFromLayers(layers: PinLayers): PinIndex {
  const inRange = (layer: Float64Array, west: number, south: number, east: number, north: number, out: PinFeature[]) => {
    const count = layer.length / FIELDS;
    for (let i = firstAtOrEast(layer, west); i < count && layer[i * FIELDS]! <= east; i++) {
      const lat = layer[i * FIELDS + 1]!;
      if (lat >= south && lat <= north) out.push(featureAt(layer, i));
    }
  };
  return {
    totalReports: layers.totalReports,
    cellCount: layers.cellCount,
    query: (bbox, zoom) => {
      const layer = layers.zooms[Math.max(0, Math.min(Math.floor(zoom), CLUSTER_MAX_ZOOM + 1))]!;
      const south = Math.max(-90, Math.min(90, bbox.south));
      const north = Math.max(-90, Math.min(90, bbox.north));
      const out: PinFeature[] = [];
      // As supercluster does: a view 360 degrees wide or more is the whole world; a view across
      // the 180th meridian (west > east once wrapped) is its two sides.
      if (bbox.east - bbox.west >= 360) {
        inRange(layer, -180, south, 180, north, out);
        return out;
      }
      const wrap = (lon: number) => ((((lon + 180) % 360) + 360) % 360) - 180;
      const west = wrap(bbox.west);
      const east = bbox.east === 180 ? 180 : wrap(bbox.east);
      if (west > east) {
        inRange(layer, west, south, 180, north, out);
        inRange(layer, -180, south, east, north, out);
      } else {
        inRange(layer, west, south, east, north, out);
      }
      return out;
    },
  };
}

/** Cluster grid cells and answer views from them (the request-thread path of a small atlas). */
export function buildPinIndex(cells: GridCell[]): PinIndex {
  return pinIndexFromLayers(buildPinLayers(cells));
}
