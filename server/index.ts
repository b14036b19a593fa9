import { createApp } from './app';
import { createDb, migrateDb } from './db/client';
import { startMail } from './email';
import { appJobs } from './jobs/app-jobs';
import { createScheduler } from './jobs/scheduler';
import { readConfig } from './lib/config';
import { seedDatabase } from './seed';

const config = readConfig();
const db = createDb(config.dbFile);
migrateDb(db);
await seedDatabase(db, config);

const { mailer } = await startMail(config, db);
createScheduler(db, appJobs({ db, mailer, appUrl: config.appUrl })).start();

const app = createApp({ db, config, mailer });
app.listen(config.port, config.host, () => {
  console.log(`Syconium is running at http://${config.host === '0.0.0.0' ? 'localhost' : config.host}:${config.port}/`);
});
