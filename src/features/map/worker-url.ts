// The URL of MapLibre's worker script as Vite emitted it (a string: importing this costs nothing).
export { default as workerUrl } from 'maplibre-gl/dist/maplibre-gl-worker.mjs?url';
