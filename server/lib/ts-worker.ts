import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { parentPort, Worker, type TransferListItem } from 'node:worker_threads';

/*
 * Worker threads that run one of our TypeScript modules and answer requests: the pin builder and
 * the tree snapshot reader use them to keep work of hundreds of milliseconds off the event loop.
 * The main thread sends { id, request }; the worker answers { id, reply } or { id, error }. Replies
 * may hand typed arrays' buffers over without a copy (the transfer list).
 */

type Envelope<Reply> = { id: number; reply: Reply } | { id: number; error: string };

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

export interface TsWorker<Request, Reply> {
  request: (request: Request) => Promise<Reply>;
  close: () => Promise<void>;
}

/**
 * Starts `entry` (a module that calls `answerRequests`) in a worker thread with `data` as its
 * workerData. The worker keeps the process alive only while a request is pending; once it fails or
 * exits, every pending and later request is rejected (the caller starts a new one).
 */
export function startTsWorker<Request, Reply>(entry: URL, data: Record<string, unknown>, name: string): TsWorker<Request, Reply> {
  const worker = new Worker(BOOT, { eval: true, workerData: { ...data, tsx: tsxApiUrl(), entry: entry.href } });
  worker.unref();
  let nextId = 0;
  let failure: Error | undefined;
  const pending = new Map<number, { resolve: (reply: Reply) => void; reject: (error: Error) => void }>();
  const failAll = (error: Error) => {
    failure ??= error;
    for (const { reject } of pending.values()) reject(error);
    pending.clear();
  };
  worker.on('message', (answer: Envelope<Reply>) => {
    const waiting = pending.get(answer.id);
    pending.delete(answer.id);
    if (pending.size === 0) worker.unref();
    if (!waiting) return;
    if ('error' in answer) waiting.reject(new Error(`${name}: ${answer.error}`));
    else waiting.resolve(answer.reply);
  });
  worker.on('error', (error) => failAll(error));
  worker.on('exit', (code) => failAll(new Error(`${name} exited (code ${code})`)));

  return {
    request: (request) =>
      new Promise((resolve, reject) => {
        if (failure) return reject(failure);
        const id = nextId++;
        pending.set(id, { resolve, reject });
        worker.ref();
        worker.postMessage({ id, request });
      }),
    close: async () => {
      await worker.terminate();
    },
  };
}

/** In the worker: answer each request with `handle`'s reply and the buffers to hand over with it. */
export function answerRequests<Request, Reply>(handle: (request: Request) => { reply: Reply; transfer?: TransferListItem[] }): void {
  parentPort!.on('message', ({ id, request }: { id: number; request: Request }) => {
    try {
      const { reply, transfer } = handle(request);
      parentPort!.postMessage({ id, reply } satisfies Envelope<Reply>, transfer);
    } catch (error) {
      parentPort!.postMessage({ id, error: error instanceof Error ? error.message : String(error) } satisfies Envelope<Reply>);
    }
  });
}
