import { randomUUID } from 'node:crypto';
import type { Db } from '../db/client';
import { ensureJob, finishJob, leaseJob } from './jobs.repo';
import { jobRunDuration, jobRunsTotal, secondsSince } from '../ops/metrics';

export interface JobDefinition<S = unknown> {
  name: string;
  /** Time from the start of one run to the next. */
  everyMs: number;
  /** How long a run may hold the job before another instance may take it over (default 10 min). */
  leaseMs?: number;
  /** Do the work. A returned value (other than undefined) is stored as the job's new state. */
  run: (ctx: { now: Date; state: S | null }) => Promise<S | void>;
}

export interface Scheduler {
  /** Run every job that is due at `now` and whose lease this instance gets; returns their names. */
  runDue: (now?: Date) => Promise<string[]>;
  start: () => void;
  stop: () => void;
}

/**
 * A small database-backed scheduler. Each instance ticks (every minute by default); the jobs table
 * holds when each job runs next and who holds its lease, so two instances never run one job at
 * the same time and a restart does not forget the schedule. No state lives in process memory.
 */
export function createScheduler(db: Db, definitions: JobDefinition<any>[], options: { tickMs?: number; owner?: string } = {}): Scheduler {
  const owner = options.owner ?? randomUUID();
  const tickMs = options.tickMs ?? 60_000;
  let timer: NodeJS.Timeout | undefined;
  let first: NodeJS.Timeout | undefined;
  let running: Promise<unknown> = Promise.resolve();

  async function runDue(now = new Date()): Promise<string[]> {
    const ran: string[] = [];
    for (const job of definitions) {
      ensureJob(db, job.name, now.getTime());
      const row = leaseJob(db, job.name, owner, now.getTime(), job.leaseMs ?? 10 * 60_000);
      if (!row) continue;
      let lastError: string | null = null;
      let state = row.state;
      const start = performance.now();
      try {
        const result = await job.run({ now, state: row.state ?? null });
        if (result !== undefined) state = result;
      } catch (err) {
        lastError = err instanceof Error ? err.message : String(err);
        console.error(`job ${job.name} failed:`, err);
      }
      jobRunDuration.observe({ job: job.name }, secondsSince(start));
      jobRunsTotal.inc({ job: job.name, outcome: lastError === null ? 'ok' : 'failed' });
      finishJob(db, job.name, owner, { nextRunAt: now.getTime() + job.everyMs, lastRunAt: now.toISOString(), lastError, state });
      ran.push(job.name);
    }
    return ran;
  }

  const tick = () => {
    // Never overlap our own ticks; the lease guards against other instances.
    running = running.then(() => runDue()).catch((err) => console.error('scheduler tick failed:', err));
  };

  return {
    runDue,
    start() {
      if (timer) return;
      first = setTimeout(tick, 5_000);
      first.unref();
      timer = setInterval(tick, tickMs);
      timer.unref();
    },
    stop() {
      clearTimeout(first);
      clearInterval(timer);
      timer = undefined;
    },
  };
}
