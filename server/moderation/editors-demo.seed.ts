import { and, eq, like, sql } from 'drizzle-orm';
import { toPublicPoint } from '../../shared/domain/public-grid';
import type { Db } from '../db/client';
import { reportFlags, reports, trees, users, varieties, waspAreas } from '../db/schema';
import { geometryBounds } from '../wasp-areas/wasp-areas.repo';
import { recordAudit } from '../audit/audit.repo';

/*
 * The editors' part of the demo (all invented): two names proposed by demo growers waiting for
 * review, each with the grower's report; two open flags; and a retired wasp area for the history.
 * Idempotent: each piece is looked up by its name or marker first.
 */

const PROPOSED = [
  {
    name: 'Amber Lanterne',
    grower: 'ines.talbot@demo.syconium.test',
    note: 'Fictional demo name: looks like a misspelling of Lantern Amber (merge it).',
    place: { lat: 42.61, lon: -73.82 },
  },
  {
    name: 'Brambleford Speckled',
    grower: 'corwin.ashby@demo.syconium.test',
    note: 'Fictional demo name: a grower’s local name with no other record yet.',
    place: { lat: 43.08, lon: -87.95 },
  },
] as const;

const FLAG_MARK = '(demo flag)';
const ODD_MARK = 'Demo report that looks wrong on purpose (invented).';

/** Reports the moderation rules should pick out: dates out of order, and ripening far too early. */
const ODD_REPORTS = [
  {
    grower: 'mira.solano@demo.syconium.test',
    variety: 'Lantern Amber',
    place: { lat: 42.7, lon: -73.7 },
    form: 'ground',
    dates: { springFrostDate: '2024-04-30', firstRipeDate: '2024-09-20', lastHarvestDate: '2024-08-30', fallFrostDate: '2024-10-08' },
  },
  {
    grower: 'greta.lindqvist@demo.syconium.test',
    variety: 'Solstice Green',
    place: { lat: 44.95, lon: -93.3 },
    form: 'ground',
    dates: { springFrostDate: '2024-05-10', firstRipeDate: '2024-07-15', lastHarvestDate: '2024-08-20', fallFrostDate: '2024-09-20' },
  },
] as const;

export function seedEditorsDemo(db: Db): void {
  db.transaction(() => {
    for (const proposal of PROPOSED) {
      if (db.select({ id: varieties.id }).from(varieties).where(sql`lower(${varieties.name}) = ${proposal.name.toLowerCase()}`).get()) continue;
      const grower = db.select({ id: users.id }).from(users).where(eq(users.email, proposal.grower)).get();
      if (!grower) continue;
      const { id: varietyId } = db
        .insert(varieties)
        .values({ name: proposal.name, status: 'proposed', proposedByUserId: grower.id, notes: proposal.note, isFictional: true })
        .returning({ id: varieties.id })
        .get();
      const { id: treeId } = db.insert(trees).values({ userId: grower.id, label: `${proposal.name} by the shed` }).returning({ id: trees.id }).get();
      const grid = toPublicPoint(proposal.place.lat, proposal.place.lon);
      db.insert(reports)
        .values({
          userId: grower.id,
          treeId,
          varietyId,
          proposedVarietyName: proposal.name,
          ...proposal.place,
          gridLat: grid.lat,
          gridLon: grid.lon,
          form: 'container',
          season: 2025,
          crop: 'main',
          outcome: 'ripened',
          springFrostDate: '2025-04-28',
          firstRipeDate: '2025-09-14',
          lastHarvestDate: '2025-10-09',
          fallFrostDate: '2025-10-12',
          notes: 'Demo report for a proposed name (invented).',
        })
        .run();
    }

    const alreadyFlagged = db.select({ id: reportFlags.id }).from(reportFlags).where(like(reportFlags.reason, `%${FLAG_MARK}%`)).get();
    const flagger = db.select({ id: users.id }).from(users).where(eq(users.email, 'grower@demo.syconium.test')).get();
    if (!alreadyFlagged && flagger) {
      const targets = db
        .select({ id: reports.id })
        .from(reports)
        .where(and(eq(reports.status, 'published'), eq(reports.outcome, 'ripened'), sql`${reports.userId} <> ${flagger.id}`))
        .orderBy(reports.id)
        .limit(2)
        .all();
      const reasons = [`The photo shows a different tree, I think. ${FLAG_MARK}`, `Ripe figs in this town that early seem unlikely. ${FLAG_MARK}`];
      targets.forEach((t, i) => db.insert(reportFlags).values({ reportId: t.id, userId: flagger.id, reason: reasons[i]! }).run());
    }

    if (!db.select({ id: reports.id }).from(reports).where(eq(reports.notes, ODD_MARK)).get()) {
      for (const odd of ODD_REPORTS) {
        const grower = db.select({ id: users.id }).from(users).where(eq(users.email, odd.grower)).get();
        const variety = db.select({ id: varieties.id }).from(varieties).where(eq(varieties.name, odd.variety)).get();
        if (!grower || !variety) continue;
        const { id: treeId } = db.insert(trees).values({ userId: grower.id, label: `${odd.variety} (south fence)` }).returning({ id: trees.id }).get();
        const grid = toPublicPoint(odd.place.lat, odd.place.lon);
        db.insert(reports)
          .values({ userId: grower.id, treeId, varietyId: variety.id, ...odd.place, gridLat: grid.lat, gridLon: grid.lon, form: odd.form, season: 2024, crop: 'main', outcome: 'ripened', ...odd.dates, notes: ODD_MARK })
          .run();
      }
    }

    const retiredName = 'Old river-mouth orchards (demo, retired)';
    if (!db.select({ id: waspAreas.id }).from(waspAreas).where(eq(waspAreas.name, retiredName)).get()) {
      const editor = db.select({ id: users.id }).from(users).where(eq(users.email, 'editor@demo.syconium.test')).get();
      const geometry = { type: 'Polygon' as const, coordinates: [[[-121.95, 37.95], [-121.55, 37.95], [-121.55, 38.2], [-121.95, 38.2], [-121.95, 37.95]]] };
      const { id } = db
        .insert(waspAreas)
        .values({
          name: retiredName,
          geometry,
          ...geometryBounds(geometry),
          source: 'Demo scenario: invented orchard survey; the caprifig hosts were removed, so the record was retired',
          observedOn: '2019-06-20',
          status: 'retired',
          retiredAt: '2025-03-01T10:00:00.000Z',
          createdById: editor?.id ?? null,
        })
        .returning({ id: waspAreas.id })
        .get();
      // its history in the audit log, so the log shows a before and after on first start
      const record = { name: retiredName, observedOn: '2019-06-20', status: 'active', retiredAt: null };
      recordAudit(db, { actorId: editor?.id ?? null, action: 'wasp-area.retire', entityType: 'wasp-area', entityId: id, before: record, after: { ...record, status: 'retired', retiredAt: '2025-03-01T10:00:00.000Z' } });
    }
  });
}
