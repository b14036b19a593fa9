import '../../map/worker';
import 'maplibre-gl/dist/maplibre-gl.css';
import type { FeatureCollection, Point } from 'geojson';
import type { CircleLayerSpecification } from 'maplibre-gl';
import { useMemo } from 'react';
import MapGL, { Layer, NavigationControl, ScaleControl, Source } from 'react-map-gl/maplibre';
import type { VarietyCell } from '@shared/schemas/variety-page';
import { createBaseStyle } from '../../map/style';
import { useUnits } from '../../units/use-units';

const CELLS_LAYER: Omit<CircleLayerSpecification, 'source'> = {
  id: 'variety-cells',
  type: 'circle',
  paint: {
    'circle-radius': ['interpolate', ['linear'], ['get', 'trees'], 1, 5, 10, 11],
    'circle-color': ['case', ['>', ['get', 'ripened'], 0], '#4d7a47', '#b0475f'],
    'circle-opacity': 0.85,
    'circle-stroke-color': '#ffffff',
    'circle-stroke-width': 1.5,
  },
};

/** The public grid cells where a variety ripened (green) or only failed (rose), on the offline base map. */
export default function VarietyCellsMap({ cells, label }: { cells: VarietyCell[]; label: string }) {
  const units = useUnits();
  const mapStyle = useMemo(() => createBaseStyle(window.location.origin), []);
  const data = useMemo<FeatureCollection<Point>>(
    () => ({
      type: 'FeatureCollection',
      features: cells.map((c) => ({
        type: 'Feature',
        properties: { ripened: c.ripenedTrees, failed: c.failedTrees, trees: c.ripenedTrees + c.failedTrees },
        geometry: { type: 'Point', coordinates: [c.gridLon, c.gridLat] },
      })),
    }),
    [cells],
  );
  const bounds = useMemo(() => {
    if (cells.length === 0) return null;
    const lats = cells.map((c) => c.gridLat);
    const lons = cells.map((c) => c.gridLon);
    const pad = 0.5;
    return [Math.min(...lons) - pad, Math.min(...lats) - pad, Math.max(...lons) + pad, Math.max(...lats) + pad] as [number, number, number, number];
  }, [cells]);
  return (
    <div className="relative h-72 overflow-hidden rounded-lg border border-fig-100" role="region" aria-label={label} data-testid="variety-cells-map">
      <MapGL
        mapStyle={mapStyle}
        initialViewState={bounds ? { bounds, fitBoundsOptions: { padding: 24, maxZoom: 8 } } : { latitude: 40, longitude: -90, zoom: 2.5 }}
        attributionControl={false}
        dragRotate={false}
        style={{ position: 'absolute', inset: 0 }}
      >
        <NavigationControl position="top-right" showCompass={false} />
        <ScaleControl position="bottom-left" unit={units.prefs.distance === 'mi' ? 'imperial' : 'metric'} maxWidth={100} />
        <Source id="variety-cells" type="geojson" data={data}>
          <Layer {...CELLS_LAYER} />
        </Source>
      </MapGL>
    </div>
  );
}
