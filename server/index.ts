import cluster from 'node:cluster';
import { createApp } from './app';
import { startCheckpointer } from './db/checkpointer';
import { createDb, migrateDb } from './db/client';
import { startMail } from './email';
import { appJobs } from './jobs/app-jobs';
import { createScheduler } from './jobs/scheduler';
import { readConfig } from './lib/config';
import { SessionSecretError, withSessionSecret } from './lib/session-secret';
import { startLoopStats } from './lib/loop-stats';
import { seedDatabase } from './seed';
import { startPayments } from './support/payments';

let config: ReturnType<typeof withSessionSecret>;
try {
  config = withSessionSecret(readConfig());
} catch (error) {
  if (!(error instanceof SessionSecretError)) throw error;
  console.error(`Syconium cannot start: ${error.message}`);
  process.exit(1);
}

// Migrations and the demo run once, before any instance serves.
if (cluster.isPrimary) {
  const db = createDb(config.dbFile);
  migrateDb(db);
  await seedDatabase(db, config);
  db.sqlite.close();
}

if (cluster.isPrimary && config.instances > 1) {
  superviseInstances(config.instances);
} else {
  await serve();
}

/**
 * SYCONIUM_INSTANCES=N: N server processes share the port (node:cluster hands out connections in
 * turn). They share nothing but the database: sessions, rate limits and job leases live there.
 * An instance that dies is replaced; SIGTERM/SIGINT stops them all.
 */
function superviseInstances(count: number): void {
  let stopping = false;
  for (let i = 0; i < count; i++) cluster.fork();
  cluster.on('exit', (worker, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    console.error(`Instance ${worker.process.pid} stopped (${signal ?? code}); starting another`);
    cluster.fork();
  });
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) return;
    stopping = true;
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill(signal);
    setTimeout(() => process.exit(1), 12_000).unref();
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
  // npm run load's "new measuring window" goes to every instance.
  if (process.env.SYCONIUM_LOOP_STATS === '1') {
    process.on('SIGUSR2', () => {
      for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill('SIGUSR2');
    });
  }
}

async function serve(): Promise<void> {
  // Measuring only (npm run load): event-loop delay, printed at shutdown; SIGUSR2 starts a new window.
  const loopStats = process.env.SYCONIUM_LOOP_STATS === '1' ? startLoopStats() : undefined;
  if (loopStats) process.on('SIGUSR2', () => loopStats.reset());
  const db = createDb(config.dbFile);
  const checkpointer = startCheckpointer(db);
  const mail = await startMail(config, db);
  const payments = await startPayments(config, db);
  const scheduler = createScheduler(db, appJobs({ db, mailer: mail.mailer, appUrl: config.appUrl }));
  scheduler.start();

  const app = createApp({ db, config, mailer: mail.mailer, payments: payments.payments });
  const server = app.listen(config.port, config.host, () => {
    const instance = cluster.isWorker ? ` (instance ${process.pid}, one of ${config.instances})` : '';
    console.log(`Syconium is running at http://${config.host === '0.0.0.0' ? 'localhost' : config.host}:${config.port}/${instance}`);
  });

  /** SIGTERM/SIGINT: stop taking requests, let those in flight finish, then close the database cleanly. */
  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    if (loopStats) console.log(`loop-stats ${JSON.stringify(loopStats.report())}`);
    console.log(`${signal}: shutting down`);
    scheduler.stop();
    // Idle keep-alive connections would hold close() open; requests in flight still finish.
    server.closeIdleConnections();
    setTimeout(() => process.exit(1), 10_000).unref();
    server.close(async () => {
      await mail.close();
      await payments.close();
      await checkpointer.stop();
      db.sqlite.close();
      process.exit(0);
    });
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}
