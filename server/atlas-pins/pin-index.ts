import Supercluster, { type ClusterProperties } from 'supercluster';
import type { Bbox, PinFeature } from '../../shared/schemas/pins';

/** One public grid cell with the number of matching reports on it (never an exact spot). */
export interface GridCell {
  gridLat: number;
  gridLon: number;
  reports: number;
  /** The report's id when the cell holds exactly one, for a direct link. */
  reportId: number | null;
}

interface CellProps {
  reports: number;
  reportId: number | null;
}
interface ClusterProps {
  reports: number;
}

/**
 * Cells cluster at zooms up to CLUSTER_MAX_ZOOM; past it every cell shows on its own. At zoom 11
 * a 0.05-degree cell is about 70 screen pixels wide, so neighbouring cells no longer overlap.
 */
export const CLUSTER_MAX_ZOOM = 10;
export const CLUSTER_RADIUS_PX = 48;

export interface PinIndex {
  totalReports: number;
  cellCount: number;
  query: (bbox: Bbox, zoom: number) => PinFeature[];
}

/**
 * Cluster grid cells with supercluster, summing each cluster's reports. Works on the coarse public
 * grid only: the input has no exact coordinates, so the output cannot leak any.
 */
export function buildPinIndex(cells: GridCell[]): PinIndex {
  const index = new Supercluster<CellProps, ClusterProps>({
    radius: CLUSTER_RADIUS_PX,
    maxZoom: CLUSTER_MAX_ZOOM,
    minPoints: 2,
    map: (props) => ({ reports: props.reports }),
    reduce: (acc, props) => {
      acc.reports += props.reports;
    },
  });
  index.load(
    cells.map((cell) => ({
      type: 'Feature' as const,
      geometry: { type: 'Point' as const, coordinates: [cell.gridLon, cell.gridLat] },
      properties: { reports: cell.reports, reportId: cell.reportId },
    })),
  );
  const totalReports = cells.reduce((sum, cell) => sum + cell.reports, 0);

  return {
    totalReports,
    cellCount: cells.length,
    query: (bbox, zoom) =>
      index.getClusters([bbox.west, bbox.south, bbox.east, bbox.north], Math.floor(zoom)).map((f): PinFeature => {
        const [lon, lat] = f.geometry.coordinates as [number, number];
        // Cluster centres are averages of cell centres; keep them as coarse as the grid.
        const coordinates: [number, number] = [Math.round(lon * 1e4) / 1e4, Math.round(lat * 1e4) / 1e4];
        const props = f.properties as Partial<ClusterProperties> & (CellProps | ClusterProps);
        if (props.cluster) {
          return {
            type: 'Feature',
            geometry: { type: 'Point', coordinates },
            properties: {
              kind: 'cluster',
              clusterId: props.cluster_id!,
              cells: props.point_count!,
              reports: props.reports,
              expansionZoom: Math.min(CLUSTER_MAX_ZOOM + 1, index.getClusterExpansionZoom(props.cluster_id!)),
            },
          };
        }
        const cell = props as CellProps;
        return { type: 'Feature', geometry: { type: 'Point', coordinates }, properties: { kind: 'cell', reports: cell.reports, reportId: cell.reportId } };
      }),
  };
}
