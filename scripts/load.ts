// `npm run load`: a load test of the production server on loopback.
//
// 1. Builds a temporary database: the demo scenario plus LOAD_REPORTS (default 200,000) synthetic
//    published reports from LOAD_GROWERS synthetic growers, bulk-inserted in one transaction.
// 2. Starts the production server (NODE_ENV=production, tsx server/index.ts) on 127.0.0.1 and a free port.
// 3. Signs in several synthetic growers, then drives mixed traffic at the same time with autocannon:
//    map pins, /api/atlas/near, report reads, and signed-in report posts from 50 concurrent writers
//    (connections open in waves first; the figures cover the traffic once all are open).
// 4. Prints per route: requests/s, median and p99 latency, errors and non-2xx answers, and any
//    "database is locked" seen in answers or the server log; then checks the targets.
// 5. Prints the server's event-loop delay over the traffic (p50/p99/max, the longest stalls) and
//    the CPU used by this client process, which shares the machine with the server.
// LOAD_PROFILE=dir profiles the server's CPU, and names what ran during each long stall.
// Bounded: LOAD_SECONDS (default 20) of traffic; a route missing from the server is skipped with a note.
import autocannon from 'autocannon';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { hashPassword } from '../server/auth/password';
import { createDb, migrateDb } from '../server/db/client';
import { readConfig } from '../server/lib/config';
import { seedDatabase } from '../server/seed';
import { startServerProcess } from './server-process';
import { insertSyntheticData, syntheticCentres, syntheticEmail } from './synthetic-data';

const REPORTS = Number(process.env.LOAD_REPORTS ?? 200_000);
const GROWERS = Number(process.env.LOAD_GROWERS ?? 4_000);
const SECONDS = Number(process.env.LOAD_SECONDS ?? 20);
const WRITERS = Number(process.env.LOAD_WRITERS ?? 50);
const READERS_PER_ROUTE = Number(process.env.LOAD_READERS ?? 10);
/** Connections opened at a time per route before the measured traffic (0: all at once, measured from the start). */
const WAVE = Number(process.env.LOAD_WAVE ?? 5);
const RAMP_LIMIT_SECONDS = 90;
/** Only the routes whose name contains one of these words (comma-separated), e.g. LOAD_ROUTES=pins,near. */
const ONLY = process.env.LOAD_ROUTES?.split(',').map((w) => w.trim()).filter(Boolean);
const SIGNED_IN_GROWERS = 12;
const PASSWORD = 'load-test-password-2026';
const READ_P99_TARGET_MS = 200;
const SEED = 2026;

const log = (line: string) => console.log(line);

/** User + system CPU seconds the server process has used (Linux /proc; NaN elsewhere). */
function serverCpuSeconds(): number {
  // The server process and, with SYCONIUM_INSTANCES > 1, its instance processes (children).
  const stat = (pid: string) => fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  try {
    let ticks = 0;
    for (const pid of fs.readdirSync('/proc').filter((name) => /^\d+$/.test(name))) {
      let fields: string[];
      try {
        fields = stat(pid);
      } catch {
        continue; // gone meanwhile
      }
      // fields[1] is the parent pid; utime and stime are in clock ticks (USER_HZ = 100).
      if (pid === String(serverPid) || fields[1] === String(serverPid)) ticks += Number(fields[11]) + Number(fields[12]);
    }
    return ticks / 100;
  } catch {
    return Number.NaN;
  }
}

interface LoopStats {
  p50: number;
  p90: number;
  p99: number;
  max: number;
  stalls: { ms: number; endS: number; endUs: number }[];
  stallCount: number;
}

/** The `loop-stats {json}` line the server prints at shutdown (server/lib/loop-stats.ts). */
function parseLoopStats(text: string): LoopStats | undefined {
  const line = text.split('\n').find((l) => l.startsWith('loop-stats '));
  return line ? (JSON.parse(line.slice('loop-stats '.length)) as LoopStats) : undefined;
}

interface CpuProfile {
  nodes: { id: number; callFrame: { functionName: string; url: string; lineNumber: number }; children?: number[] }[];
  startTime: number;
  samples: number[];
  timeDeltas: number[];
}

/** The main-thread V8 CPU profile the server wrote (file names carry the pid and thread 0). */
function readServerProfile(dir: string, pid: number): CpuProfile | undefined {
  const file = fs.readdirSync(dir).find((f) => f.includes(`.${pid}.0.`) && f.endsWith('.cpuprofile'));
  return file ? (JSON.parse(fs.readFileSync(path.join(dir, file), 'utf8')) as CpuProfile) : undefined;
}

/**
 * What the server ran between two moments (µs on the monotonic clock, which V8's profile and
 * process.hrtime share): the three functions with the most samples whose own code or callees ran,
 * named by the innermost frame of our own code (server/, shared/) when there is one.
 */
function busiestDuring(profile: CpuProfile, fromUs: number, toUs: number): string {
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const parent = new Map<number, number>();
  for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
  const label = (id: number): string => {
    const own = (n: CpuProfile['nodes'][number]) => /\/(server|shared)\//.test(n.callFrame.url);
    let cur: number | undefined = id;
    const leaf = byId.get(id)!;
    while (cur !== undefined && !own(byId.get(cur)!)) cur = parent.get(cur);
    const at = (n: CpuProfile['nodes'][number]) => `${n.callFrame.functionName || '(anonymous)'} ${n.callFrame.url.split('/').slice(-2).join('/')}:${n.callFrame.lineNumber + 1}`;
    return cur === undefined ? at(leaf) : cur === id ? at(leaf) : `${at(byId.get(cur)!)} > ${leaf.callFrame.functionName || '(native)'}`;
  };
  const spent = new Map<string, number>();
  let t = profile.startTime;
  let busy = 0;
  for (let i = 0; i < profile.samples.length; i++) {
    t += profile.timeDeltas[i] ?? 0;
    if (t < fromUs || t > toUs) continue;
    const node = byId.get(profile.samples[i]!)!;
    if (node.callFrame.functionName === '(idle)') continue;
    const us = profile.timeDeltas[i + 1] ?? 0;
    busy += us;
    const key = label(node.id);
    spent.set(key, (spent.get(key) ?? 0) + us);
  }
  const top = [...spent].sort((a, b) => b[1] - a[1]).slice(0, 3);
  // Much less sampled than wall time: the thread waited for a core (a busy machine), not for its own work.
  return top.length ? `${(busy / 1000).toFixed(0)} ms sampled: ${top.map(([k, us]) => `${k} ${(us / 1000).toFixed(0)} ms`).join('; ')}` : 'no samples in the window';
}

// ------------------------------------------------------------------ 1. the database

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-load-'));
const dbFile = path.join(dir, 'load.db');
let t0 = performance.now();
{
  const db = createDb(dbFile);
  migrateDb(db);
  await seedDatabase(db, { ...readConfig({}), seedDemo: true, adminEmail: undefined, adminPassword: undefined });
  const ids = insertSyntheticData(db.sqlite, { reports: REPORTS, growers: GROWERS, passwordHash: await hashPassword(PASSWORD), seed: SEED });
  db.sqlite.pragma('wal_checkpoint(TRUNCATE)');
  db.sqlite.close();
  log(`Seeded ${REPORTS.toLocaleString('en')} synthetic reports (ids ${ids.firstReportId}-${ids.lastReportId}) from ${GROWERS.toLocaleString('en')} growers, plus the demo, in ${((performance.now() - t0) / 1000).toFixed(1)} s (${dir})`);
}
const check = createDb(dbFile);
const reportIds = check.sqlite.prepare("SELECT id FROM reports WHERE status = 'published' ORDER BY random() LIMIT 5000").pluck().all() as number[];
const varietyIds = check.sqlite.prepare("SELECT id FROM varieties WHERE status = 'accepted'").pluck().all() as number[];
const reportsBefore = check.sqlite.prepare('SELECT count(*) FROM reports').pluck().get() as number;
check.sqlite.close();

// ------------------------------------------------------------------ 2. the production server

// LOAD_PROFILE=/some/dir writes a V8 CPU profile of the server there (open it in Chrome's DevTools).
const profileArgs = process.env.LOAD_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.LOAD_PROFILE}`] : [];
t0 = performance.now();
const server = await startServerProcess(
  {
    SYCONIUM_DB: dbFile,
    SYCONIUM_UPLOADS: path.join(dir, 'uploads'),
    SYCONIUM_DEV_MAIL: 'false',
    SMTP_HOST: '',
    SESSION_SECRET: randomBytes(32).toString('hex'),
    SYCONIUM_LOOP_STATS: '1', // server/lib/loop-stats.ts: printed at shutdown
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn', // a JSON line per request would be ~100,000 lines kept in this process
  },
  // At shutdown the server prints its loop figures and writes its profile: give it time.
  { nodeArgs: profileArgs, startTimeoutMs: 90_000, stopGraceMs: 60_000 },
).catch((error: unknown) => {
  fs.rmSync(dir, { recursive: true, force: true });
  throw error;
});
const base = server.url;
const serverPid = server.child.pid!;
process.on('SIGINT', () => {
  void server.kill();
  process.exit(130);
});

try {
  log(`Production server up on ${base} in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

  // ---------------------------------------------------------------- 3. sessions and routes

  const cookies: string[] = [];
  for (let i = 0; i < SIGNED_IN_GROWERS; i++) {
    const res = await fetch(`${base}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-syconium-request': '1' },
      body: JSON.stringify({ email: syntheticEmail(i), password: PASSWORD }),
    });
    if (!res.ok) throw new Error(`Sign-in of ${syntheticEmail(i)} failed: ${res.status} ${await res.text()}`);
    cookies.push(res.headers.getSetCookie()[0]!.split(';')[0]!);
  }
  log(`Signed in ${cookies.length} synthetic growers`);

  let counter = 0;
  const next = <T>(list: T[]): T => list[counter++ % list.length]!;
  const centres = syntheticCentres(Math.ceil(GROWERS / 10), SEED);
  const jitter = (value: number, spread: number) => (value + (Math.random() - 0.5) * spread).toFixed(4);
  const pinsPath = () => {
    const zoom = [3, 5, 7, 9][counter % 4]!;
    const c = next(centres);
    const half = 180 / 2 ** zoom;
    return `/api/atlas/pins?bbox=${Math.max(-180, c.lon - half * 1.5).toFixed(3)},${Math.max(-85, c.lat - half).toFixed(3)},${Math.min(180, c.lon + half * 1.5).toFixed(3)},${Math.min(85, c.lat + half).toFixed(3)}&zoom=${zoom}`;
  };
  const nearPath = () => {
    const c = next(centres);
    return `/api/atlas/near?lat=${jitter(c.lat, 0.3)}&lon=${jitter(c.lon, 0.3)}&radiusKm=${[25, 50, 100][counter % 3]}`;
  };
  const reportPath = () => `/api/reports/${next(reportIds)}`;
  const reportBody = () => {
    const c = next(centres);
    return JSON.stringify({
      varietyId: next(varietyIds),
      newTreeLabel: `Load tree ${counter % 7}`,
      lat: Number(jitter(c.lat, 0.2)),
      lon: Number(jitter(c.lon, 0.2)),
      form: 'ground',
      season: 2024,
      crop: 'main',
      outcome: 'ripened',
      firstRipeDate: '2024-08-20',
      notes: 'Posted by the load test',
    });
  };

  interface RouteLoad {
    name: string;
    probe: { path: string; method?: 'GET' | 'POST'; body?: string; cookie?: string };
    connections: number;
    kind: 'read' | 'write';
    request: () => autocannon.Request;
  }
  const routes: RouteLoad[] = [
    { name: 'GET /api/atlas/pins', probe: { path: pinsPath() }, connections: READERS_PER_ROUTE, kind: 'read', request: () => ({ method: 'GET', path: pinsPath() }) },
    { name: 'GET /api/atlas/near', probe: { path: nearPath() }, connections: READERS_PER_ROUTE, kind: 'read', request: () => ({ method: 'GET', path: nearPath() }) },
    { name: 'GET /api/reports/:id', probe: { path: reportPath() }, connections: READERS_PER_ROUTE, kind: 'read', request: () => ({ method: 'GET', path: reportPath() }) },
    {
      name: 'POST /api/reports',
      probe: { path: '/api/reports', method: 'POST', body: reportBody(), cookie: cookies[0] },
      connections: WRITERS,
      kind: 'write',
      request: () => ({
        method: 'POST',
        path: '/api/reports',
        headers: { 'content-type': 'application/json', 'x-syconium-request': '1', cookie: next(cookies) },
        body: reportBody(),
      }),
    },
  ];

  // A route the server does not have yet answers the API's JSON 404: skip it with a note.
  const active: RouteLoad[] = [];
  for (const route of routes) {
    if (ONLY && !ONLY.some((word) => route.name.includes(word))) {
      log(`  skipped ${route.name}: not in LOAD_ROUTES`);
      continue;
    }
    if (route.connections === 0) {
      log(`  skipped ${route.name}: no connections asked for`);
      continue;
    }
    const { path: probePath, method = 'GET', body, cookie } = route.probe;
    const started = performance.now();
    const res = await fetch(`${base}${probePath}`, {
      method,
      body,
      headers: { 'content-type': 'application/json', 'x-syconium-request': '1', ...(cookie ? { cookie } : {}) },
    });
    const text = await res.text();
    if (res.status === 404 && text.includes('No API route')) {
      log(`  skipped ${route.name}: the server has no such route yet`);
      continue;
    }
    if (!res.ok) throw new Error(`Probe of ${route.name} failed: ${res.status} ${text.slice(0, 300)}`);
    log(`  warm-up ${route.name}: ${res.status} in ${(performance.now() - started).toFixed(0)} ms`);
    active.push(route);
  }

  // ---------------------------------------------------------------- 4. mixed traffic, all at once

  // Node (libuv >= 1.45) accepts one new connection per event-loop turn, and a saturated server's
  // turn lasts as long as one request on every open connection. Opened all at once against a busy
  // server, the last connections wait 10 s and more just to be accepted (the old POST p99 of 4 s
  // and its client timeouts). So connections open in waves of LOAD_WAVE per route (each wave once
  // the previous one has been answered), and the figures cover SECONDS of traffic after every
  // connection is open. The traffic itself is unchanged: a closed loop with the same connections
  // per route. LOAD_WAVE=0 opens everything at once and measures from the first request (the old way).
  interface Tally {
    latencies: number[];
    answered: number;
    created: number;
    non2xx: number;
    errors: number;
  }
  const newTally = (): Tally => ({ latencies: [], answered: 0, created: 0, non2xx: 0, errors: 0 });
  const windowTally = new Map(active.map((r) => [r.name, newTally()]));
  const rampTally = new Map(active.map((r) => [r.name, newTally()]));
  const lockedInAnswers = new Map<string, number>();
  let measuring = false;
  const instances: autocannon.Instance[] = [];
  const finishedInstances: Promise<void>[] = [];
  const startWave = (route: RouteLoad, connections: number, duration: number) =>
    new Promise<void>((resolve) => {
      const answeredClients = new Set<unknown>();
      let finish!: () => void;
      finishedInstances.push(new Promise<void>((r) => (finish = r)));
      const instance = autocannon({
        url: base,
        connections,
        duration,
        timeout: 10,
        requests: [
          {
            setupRequest: (request) => Object.assign(request, route.request()),
            onResponse: (status, body) => {
              if (status >= 400 && /database is locked|SQLITE_BUSY|storage_unavailable/.test(body)) lockedInAnswers.set(route.name, (lockedInAnswers.get(route.name) ?? 0) + 1);
            },
          },
        ],
      }, () => finish());
      instance.on('response', (client: unknown, status: number, _bytes: number, ms: number) => {
        const tally = (measuring ? windowTally : rampTally).get(route.name)!;
        tally.answered++;
        tally.latencies.push(ms);
        if (status < 200 || status >= 300) tally.non2xx++;
        if (status === 201) tally.created++;
        answeredClients.add(client);
        if (answeredClients.size === connections) resolve();
      });
      instance.on('reqError', () => (measuring ? windowTally : rampTally).get(route.name)!.errors++);
      instances.push(instance);
      // Measured without waves: nothing to wait for.
      if (!WAVE) resolve();
    });

  const rampStarted = performance.now();
  if (WAVE) {
    log(`\nOpening ${active.map((r) => `${r.connections} × ${r.name}`).join(', ')} in waves of ${WAVE} connections...`);
    const waves = active.flatMap((route) => Array.from({ length: Math.ceil(route.connections / WAVE) }, (_, i) => ({ route, connections: Math.min(WAVE, route.connections - i * WAVE) })));
    // Round-robin over the routes, so every route is running before the big ones finish opening.
    waves.sort((a, b) => waves.filter((w) => w.route === a.route).indexOf(a) - waves.filter((w) => w.route === b.route).indexOf(b));
    for (const wave of waves) {
      const answered = startWave(wave.route, wave.connections, RAMP_LIMIT_SECONDS + SECONDS + 10);
      const timedOut = await Promise.race([answered.then(() => false), new Promise<boolean>((r) => setTimeout(() => r(true), RAMP_LIMIT_SECONDS * 1000))]);
      if (timedOut) throw new Error(`A wave of ${wave.connections} × ${wave.route.name} was not answered within ${RAMP_LIMIT_SECONDS} s`);
    }
    log(`All connections open and answered in ${((performance.now() - rampStarted) / 1000).toFixed(1)} s`);
  }
  log(`\nDriving ${active.map((r) => `${r.connections} × ${r.name}`).join(', ')} for ${SECONDS} s at the same time...`);
  measuring = true;
  server.child.kill('SIGUSR2'); // a new event-loop-delay window for the measured traffic alone
  const cpuBefore = serverCpuSeconds();
  const clientCpuBefore = process.cpuUsage();
  const wallBefore = performance.now();
  if (WAVE) {
    await new Promise((r) => setTimeout(r, SECONDS * 1000));
    measuring = false;
  } else {
    for (const route of active) void startWave(route, route.connections, SECONDS);
  }
  const finished = Promise.all(finishedInstances);
  if (WAVE) for (const instance of instances) instance.stop();
  await finished;
  measuring = false;

  // ---------------------------------------------------------------- 5. figures and targets

  const cpuUsed = serverCpuSeconds() - cpuBefore;
  const wall = (performance.now() - wallBefore) / 1000;
  const clientCpu = process.cpuUsage(clientCpuBefore);
  const clientCpuUsed = (clientCpu.user + clientCpu.system) / 1e6;
  // Stop the server now: it prints its event-loop figures (and writes its CPU profile) on the way out.
  await server.stop();
  const loop = parseLoopStats(server.output());

  const lockedInLog = (server.output().match(/database is locked|SQLITE_BUSY/g) ?? []).length;
  const percentile = (sorted: number[], p: number) => (sorted.length ? Math.round(sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!) : 0);
  const rows = active.map((route) => {
    const t = windowTally.get(route.name)!;
    const sorted = [...t.latencies].sort((a, b) => a - b);
    return {
      route: route.name,
      conns: route.connections,
      'req/s': Math.round(t.answered / wall),
      requests: t.answered,
      'median ms': percentile(sorted, 50),
      'p99 ms': percentile(sorted, 99),
      errors: t.errors,
      non2xx: t.non2xx,
      locked: lockedInAnswers.get(route.name) ?? 0,
    };
  });
  log('');
  console.table(rows);
  const final = createDb(dbFile);
  const reportsAfter = final.sqlite.prepare('SELECT count(*) FROM reports').pluck().get() as number;
  const integrity = final.sqlite.prepare('PRAGMA integrity_check').pluck().get() as string;
  final.sqlite.close();
  const posted = rows.find((r) => r.route === 'POST /api/reports');
  // Posts answered while the connections were opening are stored too.
  const postTallies = posted ? [rampTally.get(posted.route)!, windowTally.get(posted.route)!] : [];
  const postsAnswered = postTallies.reduce((n, t) => n + t.answered, 0);
  const postsCreated = postTallies.reduce((n, t) => n + t.created, 0);
  const rampErrors = [...rampTally].filter(([, t]) => t.errors || t.non2xx);
  log(`Reports stored: ${reportsBefore.toLocaleString('en')} -> ${reportsAfter.toLocaleString('en')} (+${reportsAfter - reportsBefore}${posted ? `; ${postsAnswered} posts answered, ${postsCreated} with 201` : ''}); integrity_check: ${integrity}`);
  log(`"database is locked" in the server log: ${lockedInLog}`);
  const answered = rows.reduce((n, r) => n + r.requests, 0);
  if (Number.isFinite(cpuUsed)) {
    // The server's own CPU time does not depend on what else the machine runs: a fairer figure on a shared host.
    log(`Server CPU: ${cpuUsed.toFixed(1)} s over ${wall.toFixed(1)} s of traffic (${((100 * cpuUsed) / wall).toFixed(0)} % of one core), ${((1000 * cpuUsed) / Math.max(1, answered)).toFixed(1)} ms per answered request; machine load average ${os.loadavg()[0]!.toFixed(1)} on ${os.cpus().length} cores`);
  }
  if (WAVE) {
    const ramp = [...rampTally].map(([name, t]) => `${name} ${t.answered} answered, max ${Math.round(Math.max(0, ...t.latencies))} ms, ${t.errors} errors`);
    log(`While the connections opened (not in the table): ${ramp.join('; ')}`);
  }
  log(`Load client CPU (autocannon, this process): ${clientCpuUsed.toFixed(1)} s (${((100 * clientCpuUsed) / wall).toFixed(0)} % of one core)`);
  if (loop) {
    log(`Server event loop over the traffic: delay p50 ${loop.p50} ms, p90 ${loop.p90} ms, p99 ${loop.p99} ms, max ${loop.max} ms; ${loop.stallCount} stalls of 100 ms or more`);
    const profile = process.env.LOAD_PROFILE ? readServerProfile(process.env.LOAD_PROFILE, serverPid) : undefined;
    for (const stall of loop.stalls.slice(0, 8)) {
      log(`  stall ${stall.ms} ms ending ${stall.endS.toFixed(2)} s into the traffic${profile ? `: ${busiestDuring(profile, stall.endUs - stall.ms * 1000, stall.endUs)}` : ''}`);
    }
  }

  const failures: string[] = [];
  for (const row of rows) {
    if (row.errors || row.non2xx) failures.push(`${row.route}: ${row.errors} errors, ${row.non2xx} non-2xx`);
    if (row.locked) failures.push(`${row.route}: ${row.locked} "database is locked" answers`);
    if (active.find((r) => r.name === row.route)!.kind === 'read' && row['p99 ms'] >= READ_P99_TARGET_MS) failures.push(`${row.route}: p99 ${row['p99 ms']} ms (target < ${READ_P99_TARGET_MS} ms)`);
  }
  if (lockedInLog) failures.push(`"database is locked" appeared ${lockedInLog} times in the server log`);
  // Posts still in flight when autocannon stops may be stored without being counted; none may be lost.
  if (posted && reportsAfter - reportsBefore < postsCreated + 1) failures.push(`stored reports (+${reportsAfter - reportsBefore}) are fewer than the 201 answers (${postsCreated} + 1 probe)`);
  for (const [name, t] of rampErrors) failures.push(`${name}: ${t.errors} errors, ${t.non2xx} non-2xx while the connections were opening`);
  if (integrity !== 'ok') failures.push(`integrity_check: ${integrity}`);
  log(failures.length ? `\nTargets missed:\n  ${failures.join('\n  ')}` : `\nTargets met: zero errors, no "database is locked", read p99 under ${READ_P99_TARGET_MS} ms with ${WRITERS} concurrent writers.`);
  process.exitCode = failures.length ? 1 : 0;
} finally {
  await server.stop();
  fs.rmSync(dir, { recursive: true, force: true });
}
