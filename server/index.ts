import { createApp } from './app';
import { createDb, migrateDb } from './db/client';
import { startMail } from './email';
import { appJobs } from './jobs/app-jobs';
import { createScheduler } from './jobs/scheduler';
import { readConfig } from './lib/config';
import { startLoopStats } from './lib/loop-stats';
import { seedDatabase } from './seed';

const config = readConfig();
// Measuring only (npm run load): event-loop delay, printed at shutdown; SIGUSR2 starts a new window.
const loopStats = process.env.SYCONIUM_LOOP_STATS === '1' ? startLoopStats() : undefined;
if (loopStats) process.on('SIGUSR2', () => loopStats.reset());
const db = createDb(config.dbFile);
migrateDb(db);
await seedDatabase(db, config);

const mail = await startMail(config, db);
const scheduler = createScheduler(db, appJobs({ db, mailer: mail.mailer, appUrl: config.appUrl }));
scheduler.start();

const app = createApp({ db, config, mailer: mail.mailer });
const server = app.listen(config.port, config.host, () => {
  console.log(`Syconium is running at http://${config.host === '0.0.0.0' ? 'localhost' : config.host}:${config.port}/`);
});

/** SIGTERM/SIGINT: stop taking requests, let those in flight finish, then close the database cleanly. */
let stopping = false;
function shutdown(signal: string): void {
  if (stopping) return;
  stopping = true;
  if (loopStats) console.log(`loop-stats ${JSON.stringify(loopStats.report())}`);
  console.log(`${signal}: shutting down`);
  scheduler.stop();
  // Idle keep-alive connections would hold close() open; requests in flight still finish.
  server.closeIdleConnections();
  const forced = setTimeout(() => process.exit(1), 10_000);
  forced.unref();
  server.close(async () => {
    await mail.close();
    db.sqlite.close();
    process.exit(0);
  });
}
process.once('SIGTERM', () => shutdown('SIGTERM'));
process.once('SIGINT', () => shutdown('SIGINT'));
