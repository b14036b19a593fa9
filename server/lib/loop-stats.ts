import { monitorEventLoopDelay } from 'node:perf_hooks';

/** Stalls at least this long are listed one by one (with when they ended), the rest only counted. */
const STALL_MS = 100;
const TICK_MS = 20;

export interface LoopStats {
  /** Event-loop delay percentiles in ms over the window (perf_hooks.monitorEventLoopDelay). */
  p50: number;
  p90: number;
  p99: number;
  max: number;
  /** Seconds since the window started. */
  seconds: number;
  /** The longest stalls of at least STALL_MS: ms, and when each ended (s into the window; hrtime µs, the clock of V8's CPU profiles). */
  stalls: { ms: number; endS: number; endUs: number }[];
  stallCount: number;
}

/**
 * SYCONIUM_LOOP_STATS=1: measure how long the single Node thread is blocked (a synchronous SQLite
 * call, a big JSON answer, GC) while the server runs. SIGUSR2 starts a new window (npm run load
 * sends it when traffic starts); the figures are printed as one `loop-stats {json}` line at
 * shutdown. Off by default: it costs a timer tick every 20 ms.
 */
export function startLoopStats(): { report: () => LoopStats; reset: () => void } {
  const histogram = monitorEventLoopDelay({ resolution: 10 });
  histogram.enable();
  let started = process.hrtime.bigint();
  let last = started;
  let stalls: LoopStats['stalls'] = [];
  let stallCount = 0;
  const timer = setInterval(() => {
    const now = process.hrtime.bigint();
    const late = Number(now - last) / 1e6 - TICK_MS;
    last = now;
    if (late >= STALL_MS) {
      stallCount++;
      stalls.push({ ms: Math.round(late), endS: Number(now - started) / 1e9, endUs: Number(now / 1000n) });
      if (stalls.length > 40) stalls = stalls.sort((a, b) => b.ms - a.ms).slice(0, 20);
    }
  }, TICK_MS);
  timer.unref();
  const ms = (ns: number) => Math.round(ns / 1e5) / 10;
  return {
    reset() {
      histogram.reset();
      started = process.hrtime.bigint();
      stalls = [];
      stallCount = 0;
    },
    report() {
      return {
        p50: ms(histogram.percentile(50)),
        p90: ms(histogram.percentile(90)),
        p99: ms(histogram.percentile(99)),
        max: ms(histogram.max),
        seconds: Math.round(Number(process.hrtime.bigint() - started) / 1e8) / 10,
        stalls: stalls.sort((a, b) => b.ms - a.ms).slice(0, 20).map((s) => ({ ...s, endS: Math.round(s.endS * 100) / 100 })),
        stallCount,
      };
    },
  };
}
