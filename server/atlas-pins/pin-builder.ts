import { startTsWorker } from '../lib/ts-worker';
import type { PinLayers } from './pin-index';

/*
 * Counting a large atlas's reports per grid cell and clustering the cells take hundreds of
 * milliseconds of CPU. On the event loop, every request queued meanwhile would wait that long, so a
 * large atlas builds its pin layers in a worker thread (pin-builder.worker.ts) with its own
 * connection to the database file, and the server keeps answering meanwhile. The layers come back
 * as typed arrays handed over without a copy; the request thread only wraps them.
 */

export interface BuildRequest {
  sql: string;
  params: unknown[];
}

export interface PinBuild {
  /** The atlas data version the layers were built at (`atlasDataVersion`). */
  version: number;
  layers: PinLayers;
  /** Milliseconds the worker spent counting cells (SQL) and clustering them. */
  queryMs: number;
  clusterMs: number;
}

export interface PinBuilder {
  /** Builds the layers of a pin-cells query (`pinCellsQuery(...).toSQL()`). */
  build: (query: BuildRequest) => Promise<PinBuild>;
  close: () => Promise<void>;
}

/** A worker thread that builds pin layers from `file`. It keeps the process alive only while a build is pending. */
export function createPinBuilder(file: string): PinBuilder {
  const worker = startTsWorker<BuildRequest, PinBuild>(new URL('./pin-builder.worker.ts', import.meta.url), { file }, 'pin builder');
  return { build: ({ sql, params }) => worker.request({ sql, params }), close: worker.close };
}
