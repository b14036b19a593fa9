import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { PinLayers } from './pin-index';

/*
 * Counting a large atlas's reports per grid cell and clustering the cells take hundreds of
 * milliseconds of CPU. On the event loop, every request queued meanwhile would wait that long, so a
 * large atlas builds its pin layers in a worker thread (pin-builder.worker.ts) with its own
 * connection to the database file, and the server keeps answering meanwhile. The layers come back
 * as typed arrays handed over without a copy; the request thread only wraps them.
 */

export interface BuildRequest {
  id: number;
  sql: string;
  params: unknown[];
}
export type BuildReply = { id: number; version: number; layers: PinLayers; queryMs: number; clusterMs: number } | { id: number; error: string };

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
  build: (query: { sql: string; params: unknown[] }) => Promise<PinBuild>;
  close: () => Promise<void>;
}

/**
 * The worker starts from this CommonJS snippet, which loads the TypeScript entry through tsx's API:
 * the same under `tsx server/index.ts`, `node --import tsx` and vitest.
 */
const BOOT = `
const { workerData } = require('node:worker_threads');
import(workerData.tsx)
  .then(({ tsImport }) => tsImport(workerData.entry, workerData.entry))
  .catch((error) => setImmediate(() => { throw error; }));
`;

function tsxApiUrl(): string {
  // tsx's 'tsx/esm/api' resolves to its CommonJS build under require(); the ES module sits beside it.
  const resolved = createRequire(import.meta.url).resolve('tsx/esm/api');
  return pathToFileURL(resolved.replace(/\.cjs$/, '.mjs')).href;
}

/** A worker thread that builds pin layers from `file`. It keeps the process alive only while a build is pending. */
export function createPinBuilder(file: string): PinBuilder {
  const worker = new Worker(BOOT, {
    eval: true,
    workerData: { file, tsx: tsxApiUrl(), entry: new URL('./pin-builder.worker.ts', import.meta.url).href },
  });
  worker.unref();
  let nextId = 0;
  let failure: Error | undefined;
  const pending = new Map<number, { resolve: (build: PinBuild) => void; reject: (error: Error) => void }>();
  const failAll = (error: Error) => {
    failure ??= error;
    for (const { reject } of pending.values()) reject(error);
    pending.clear();
  };
  worker.on('message', (reply: BuildReply) => {
    const waiting = pending.get(reply.id);
    pending.delete(reply.id);
    if (pending.size === 0) worker.unref();
    if (!waiting) return;
    if ('error' in reply) waiting.reject(new Error(`pin builder: ${reply.error}`));
    else waiting.resolve({ version: reply.version, layers: reply.layers, queryMs: reply.queryMs, clusterMs: reply.clusterMs });
  });
  worker.on('error', (error) => failAll(error));
  worker.on('exit', (code) => failAll(new Error(`pin builder exited (code ${code})`)));

  return {
    build: ({ sql, params }) =>
      new Promise((resolve, reject) => {
        if (failure) return reject(failure);
        const id = nextId++;
        pending.set(id, { resolve, reject });
        worker.ref();
        worker.postMessage({ id, sql, params } satisfies BuildRequest);
      }),
    close: async () => {
      await worker.terminate();
    },
  };
}
