import { count, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { reports, trees, users, varieties, varietySynonyms, waspAreas } from '../db/schema';
import { geometryBounds } from '../wasp-areas/wasp-areas.repo';
import { hashPassword } from '../auth/password';
import type { Config } from '../lib/config';
import { findUserByEmail, insertUser } from '../users/users.repo';
import { buildDemoReports } from './demo-reports';
import { seedDemoPhotos } from '../reports/demo-photos.seed';
import { seedDemoSavedPlaces } from '../saved-places/saved-places.seed';
import { seedEditorsDemo } from '../moderation/editors-demo.seed';
import { seedDemoDigest } from '../email/digest.seed';
import { seedDemoSupporters } from '../support/support.seed';
import { seedDemoFollows } from '../follows/follows.seed';
import { seedDemoStations } from './demo-stations';
import { loadShippedNormals } from '../normals/normals.repo';
import { seedDemoAtlas } from './demo-atlas-seed';
import { DEMO_COOL_COAST_EMAIL_DOMAIN, seedDemoCoolCoast } from './demo-cool-coast';
import { DEMO_ATLAS_EMAIL_DOMAIN } from './demo-atlas-scenario';
import { DEMO_ACCOUNTS, DEMO_GROWER_NAMES, DEMO_PASSWORD, DEMO_VARIETIES, DEMO_WASP_AREAS } from './demo-scenario';

/**
 * Load the demo scenario into an empty atlas, and the first admin from the environment.
 * Idempotent: each part checks what is already there and adds only what is missing.
 */
export async function seedDatabase(
  db: Db,
  config: Pick<Config, 'seedDemo' | 'adminEmail' | 'adminPassword'> & {
    uploadsDir?: string;
    /** The demo atlas's several hundred growers (default: yes). Tests that need only the story skip them to stay quick. */
    demoAtlas?: boolean;
    /** NOAA's climate normals, reference data on every install (default: yes). Tests of station arithmetic skip them. */
    referenceClimate?: boolean;
  },
): Promise<void> {
  if (config.referenceClimate !== false) {
    const loaded = loadShippedNormals(db);
    if (loaded) console.log(`Climate normals ${loaded.release}: ${loaded.added.length} stations added, ${loaded.replaced.length} replaced in ${Math.round(loaded.ms)} ms`);
  }
  if (config.adminEmail && config.adminPassword && !findUserByEmail(db, config.adminEmail)) {
    insertUser(db, {
      email: config.adminEmail,
      displayName: 'Administrator',
      passwordHash: await hashPassword(config.adminPassword),
      role: 'admin',
      emailVerifiedAt: new Date().toISOString(),
    });
  }
  if (!config.seedDemo) return;
  await seedDemoAccounts(db);
  seedDemoVarieties(db);
  seedDemoReports(db);
  seedDemoCoolCoast(db);
  if (config.demoAtlas !== false) seedDemoAtlas(db);
  if (config.uploadsDir) await seedDemoPhotos(db, config.uploadsDir);
  seedDemoWaspAreas(db);
  seedDemoStations(db);
  seedDemoSavedPlaces(db);
  seedEditorsDemo(db);
  seedDemoDigest(db);
  seedDemoSupporters(db);
  seedDemoFollows(db);
}

async function seedDemoAccounts(db: Db): Promise<void> {
  const existing = db.select({ n: count() }).from(users).where(eq(users.isDemo, true)).get()!.n;
  if (existing > 0) return;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const verified = new Date().toISOString();
  db.transaction(() => {
    for (const account of DEMO_ACCOUNTS) insertUser(db, { ...account, passwordHash, emailVerifiedAt: verified, isDemo: true });
    for (const name of DEMO_GROWER_NAMES) {
      const email = `${name.toLowerCase().replace(/[^a-z]+/g, '.')}@demo.syconium.test`;
      insertUser(db, { email, displayName: `${name} (demo)`, passwordHash, role: 'grower', emailVerifiedAt: verified, isDemo: true });
    }
  });
}

function seedDemoVarieties(db: Db): void {
  const existing = db.select({ n: count() }).from(varieties).where(eq(varieties.isFictional, true)).get()!.n;
  if (existing > 0) return;
  db.transaction(() => {
    for (const { synonyms, ...variety } of DEMO_VARIETIES) {
      const row = db
        .insert(varieties)
        .values({ ...variety, isFictional: true, sources: 'Invented for the Syconium demo; not a real cultivar.' })
        .returning({ id: varieties.id })
        .get();
      for (const name of synonyms) db.insert(varietySynonyms).values({ varietyId: row.id, name }).run();
    }
  });
}

function seedDemoReports(db: Db): void {
  if (db.select({ n: count() }).from(reports).get()!.n > 0) return;
  const demoGrowers = db.select({ id: users.id, email: users.email }).from(users).where(eq(users.isDemo, true)).all().filter((u) => !u.email.startsWith('admin@') && !u.email.startsWith('editor@') && !u.email.endsWith(`@${DEMO_ATLAS_EMAIL_DOMAIN}`) && !u.email.endsWith(`@${DEMO_COOL_COAST_EMAIL_DOMAIN}`));
  const varietyIds = new Map(db.select({ id: varieties.id, name: varieties.name }).from(varieties).all().map((v) => [v.name, v.id]));
  const demoReports = buildDemoReports(demoGrowers.length, DEMO_VARIETIES);
  db.transaction(() => {
    const treeIds = new Map<string, number>();
    for (const { growerIndex, treeKey, varietyName, ...report } of demoReports) {
      const userId = demoGrowers[growerIndex]!.id;
      let treeId = treeIds.get(treeKey);
      if (treeId === undefined) {
        treeId = db.insert(trees).values({ userId, label: `${varietyName} #${Number(treeKey.split(':')[1]) + 1}` }).returning({ id: trees.id }).get().id;
        treeIds.set(treeKey, treeId);
      }
      db.insert(reports).values({ ...report, userId, treeId, varietyId: varietyIds.get(varietyName)! }).run();
    }
  });
}

function seedDemoWaspAreas(db: Db): void {
  if (db.select({ n: count() }).from(waspAreas).get()!.n > 0) return;
  const editor = findUserByEmail(db, 'editor@demo.syconium.test');
  db.transaction(() => {
    for (const { coordinates, ...area } of DEMO_WASP_AREAS) {
      const geometry = { type: 'Polygon' as const, coordinates };
      db.insert(waspAreas).values({ ...area, geometry, ...geometryBounds(geometry), createdById: editor?.id ?? null }).run();
    }
  });
}
