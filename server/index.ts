import { createApp } from './app';
import { createDb, migrateDb } from './db/client';
import { readConfig } from './lib/config';
import { seedDatabase } from './seed';

const config = readConfig();
const db = createDb(config.dbFile);
migrateDb(db);
await seedDatabase(db, config);

const app = createApp({ db, config });
app.listen(config.port, config.host, () => {
  console.log(`Syconium is running at http://${config.host === '0.0.0.0' ? 'localhost' : config.host}:${config.port}/`);
});
