import { setWorkerUrl } from 'maplibre-gl';
import { workerUrl } from './worker-url';

// After bundling, MapLibre cannot find its worker by itself ("Worker failed to load"): point it at
// the worker file Vite emitted, before the first map is created. Importing this module does that.
setWorkerUrl(workerUrl);
