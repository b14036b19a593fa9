import client from 'prom-client';

/*
 * The process's Prometheus metrics (prom-client), served at /metrics (server/ops/ops.router.ts).
 * One registry per process: under SYCONIUM_INSTANCES=N each instance answers with its own figures
 * (scrape each, or sum them in Prometheus). Names carry the `syconium_` prefix; time is in seconds.
 */
export const metricsRegistry = new client.Registry();
client.collectDefaultMetrics({ register: metricsRegistry, prefix: 'syconium_' });

/** Per route *pattern* (e.g. /api/reports/:id), never the raw URL: bounded label values, no ids or places. */
export const httpRequestDuration = new client.Histogram({
  name: 'syconium_http_request_duration_seconds',
  help: 'Time from request to the end of the answer, by method, route pattern and status code',
  labelNames: ['method', 'route', 'status_code'] as const,
  buckets: [0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10],
  registers: [metricsRegistry],
});

export const writeBatchesTotal = new client.Counter({
  name: 'syconium_write_batches_total',
  help: 'Shared write transactions committed or failed by the group-commit batcher (server/db/write-batcher.ts)',
  labelNames: ['outcome'] as const,
  registers: [metricsRegistry],
});

export const writeBatchItems = new client.Histogram({
  name: 'syconium_write_batch_items',
  help: 'Writes (e.g. report posts) sharing one batch transaction',
  buckets: [1, 2, 4, 8, 16, 32, 64],
  registers: [metricsRegistry],
});

export const snapshotRebuildDuration = new client.Histogram({
  name: 'syconium_snapshot_rebuild_seconds',
  help: 'Time to rebuild an in-memory snapshot or cache from the database (map pins, tree snapshot), by cache and thread',
  labelNames: ['cache', 'thread'] as const,
  buckets: [0.001, 0.005, 0.025, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30],
  registers: [metricsRegistry],
});

export const jobRunsTotal = new client.Counter({
  name: 'syconium_job_runs_total',
  help: 'Scheduled job runs (server/jobs/app-jobs.ts), by job and outcome',
  labelNames: ['job', 'outcome'] as const,
  registers: [metricsRegistry],
});

export const jobRunDuration = new client.Histogram({
  name: 'syconium_job_run_seconds',
  help: 'Time a scheduled job run took, by job',
  labelNames: ['job'] as const,
  buckets: [0.01, 0.1, 0.5, 1, 5, 15, 60, 300],
  registers: [metricsRegistry],
});

/** Seconds since a `performance.now()` reading. */
export const secondsSince = (start: number) => (performance.now() - start) / 1000;
