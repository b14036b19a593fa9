import { useQuery } from '@tanstack/react-query';
import { lazy, Suspense, useCallback, useEffect, useRef, useState } from 'react';
import { useSearchParams } from 'react-router';
import type { PinFilters } from '@shared/schemas/pins';
import { useCurrentUser } from '../features/auth/api';
import { mapQueries } from '../features/map/api';
import type { AtlasMapHandle } from '../features/map/components/atlas-map';
import { PinPreview } from '../features/map/components/pin-preview';
import { workerUrl } from '../features/map/worker-url';
import { FiltersPanel } from '../features/map/components/filters-panel';
import { MapLegend } from '../features/map/components/map-legend';
import { PlaceSearch } from '../features/map/components/place-search';
import { atlasUrlParams, DEFAULT_VIEW, parseAtlasUrl, type AtlasUrlState, type MapView, type OverlayName } from '../features/map/url-state';

// MapLibre is most of the first visit's bytes: the page (filters, search, a preview of the pins)
// draws without it, and its chunk starts downloading as soon as this module runs.
const loadAtlasMap = () => import('../features/map/components/atlas-map');
void loadAtlasMap();
// MapLibre's worker script is otherwise asked for only once the map exists: fetched alongside, it is
// then read from the HTTP cache (hashed name, cached for good).
void fetch(workerUrl).then((answer) => answer.arrayBuffer(), () => undefined);
const AtlasMap = lazy(() => loadAtlasMap().then((m) => ({ default: m.AtlasMap })));

/** The home screen: the atlas map under the header, its filters beside it, all kept in the URL. */
export default function HomeRoute() {
  const [params, setParams] = useSearchParams();
  const state = parseAtlasUrl(params);
  const stateRef = useRef(state);
  stateRef.current = state;
  const mapRef = useRef<AtlasMapHandle>(null);
  const [panelOpen, setPanelOpen] = useState(() => window.matchMedia?.('(min-width: 768px)').matches ?? true);
  const [total, setTotal] = useState<number | null>(null);

  // Opened on a shared view, the map stays there; otherwise on the grower's home place once known.
  const [openedWithView] = useState(() => state.view !== null);
  const [initialView] = useState<MapView>(() => state.view ?? DEFAULT_VIEW);
  const movedByUser = useRef(false);
  const { user } = useCurrentUser();
  const home = useQuery({ ...mapQueries.homePlace(), enabled: user !== null });
  useEffect(() => {
    if (home.data && !openedWithView && !movedByUser.current) mapRef.current?.flyTo({ lat: home.data.lat, lon: home.data.lon, zoom: 8 });
  }, [home.data, openedWithView]);

  const update = useCallback(
    (patch: Partial<AtlasUrlState>) => setParams(atlasUrlParams({ ...stateRef.current, ...patch }), { replace: true }),
    [setParams],
  );
  const onViewChange = useCallback(
    (view: MapView) => {
      const previous = stateRef.current.view;
      if (previous && Math.abs(previous.lat - view.lat) < 1e-4 && Math.abs(previous.lon - view.lon) < 1e-4 && Math.abs(previous.zoom - view.zoom) < 1e-2) return;
      if (previous || view.zoom !== initialView.zoom || view.lat !== initialView.lat) movedByUser.current = true;
      update({ view });
    },
    [update, initialView],
  );
  const goTo = useCallback((view: MapView) => {
    movedByUser.current = true;
    mapRef.current?.flyTo(view);
  }, []);

  return (
    <div className="absolute inset-0 flex">
      <section className="relative min-w-0 flex-1" aria-label="Atlas map">
        {/* Before the map canvas in the page order, so Tab reaches the town search first. */}
        <div className="pointer-events-none absolute inset-x-0 top-0 z-[5] flex items-start gap-2 p-3 pr-14">
          {!panelOpen && (
            <button
              type="button"
              onClick={() => setPanelOpen(true)}
              aria-controls="atlas-filters"
              aria-expanded={false}
              className="pointer-events-auto shrink-0 rounded-lg border border-fig-100 bg-paper/95 px-3 py-2 text-sm font-medium text-fig-700 shadow-sm hover:bg-fig-50"
            >
              Filters &amp; layers
            </button>
          )}
          <PlaceSearch onGo={goTo} center={state.view ?? initialView} />
        </div>
        <PinPreview view={initialView} filters={state.filters} />
        <Suspense>
          <AtlasMap ref={mapRef} initialView={initialView} filters={state.filters} overlays={state.layers} onViewChange={onViewChange} onTotalChange={setTotal} home={home.data} />
        </Suspense>
        <div className="pointer-events-none absolute bottom-3 left-3 pr-28">
          <MapLegend overlays={state.layers} openAtStart={panelOpen} />
        </div>
      </section>
      {/* After the map in the page order (shown on its left), so Tab reaches the town search and the map before the filters. */}
      <aside
        id="atlas-filters"
        aria-label="Filters and layers"
        className={`${panelOpen ? 'flex' : 'hidden'} absolute inset-y-0 left-0 z-10 md:order-first w-[min(20rem,88vw)] flex-col border-r border-fig-100 bg-paper shadow-lg md:static md:shadow-none`}
      >
        <div className="flex items-center justify-between border-b border-fig-100 px-4 py-3">
          <h1 className="text-base font-semibold text-fig-900">What ripens where</h1>
          <button type="button" onClick={() => setPanelOpen(false)} className="rounded-md px-2 py-1 text-sm text-ink/70 hover:bg-fig-50" aria-controls="atlas-filters">
            Hide
          </button>
        </div>
        <div className="flex-1 overflow-y-auto px-4 py-4">
          <FiltersPanel
            filters={state.filters}
            overlays={state.layers}
            totalReports={total}
            onFiltersChange={(filters: PinFilters) => update({ filters })}
            onOverlaysChange={(layers: OverlayName[]) => update({ layers })}
          />
        </div>
      </aside>
    </div>
  );
}
