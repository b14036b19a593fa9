import { describe, expect, it } from 'vitest';
import { findSuspiciousReports } from '../../shared/domain/moderation-rules';
import { reportRuleIssues } from '../../shared/domain/report-rules';
import { seedDatabase } from '../../server/seed';
import { buildDemoAtlas, inDemoWaspArea } from '../../server/seed/demo-atlas';
import { DEMO_ATLAS_EMAIL_DOMAIN, DEMO_ATLAS_TOWNS, DEMO_ATLAS_VARIETIES } from '../../server/seed/demo-atlas-scenario';
import { DEMO_GROWER_NAMES, DEMO_TOWNS, DEMO_VARIETIES, type DemoVariety } from '../../server/seed/demo-scenario';
import { createTestContext } from '../helpers/test-app';

/*
 * The demo atlas is invented: these tests check that it keeps the demo story's own rules (the
 * story, not the world, is the reference here) and the rules every report must keep.
 */

const NOW = new Date('2026-12-02T12:00:00Z');
const atlas = buildDemoAtlas({ now: NOW });
const towns = new Map([...DEMO_TOWNS, ...DEMO_ATLAS_TOWNS].map((t) => [t.name, t]));
const varieties = new Map([...DEMO_VARIETIES, ...DEMO_ATLAS_VARIETIES].map((v) => [v.name, v]));
const townOf = (r: { growerIndex: number }) => towns.get(atlas.growers[r.growerIndex]!.town)!;
const share = (list: { outcome: string }[]) => list.filter((r) => r.outcome === 'ripened').length / list.length;

describe('the demo atlas (pure)', () => {
  it('is the same on every build, and large enough to feel lived in', () => {
    expect(buildDemoAtlas({ now: NOW })).toEqual(atlas);
    expect(atlas.growers.length).toBeGreaterThanOrEqual(400);
    expect(atlas.reports.length).toBeGreaterThanOrEqual(2500);
    // the story's towns first: every one of them gets growers of its own
    const used = new Set(atlas.growers.map((g) => g.town));
    for (const town of DEMO_TOWNS) expect(used.has(town.name), town.name).toBe(true);
  });

  it('invents unique growers that never reuse the story’s names, and only fictional varieties', () => {
    const names = atlas.growers.map((g) => g.name);
    expect(new Set(names).size).toBe(names.length);
    expect(new Set(atlas.growers.map((g) => g.email)).size).toBe(names.length);
    for (const name of DEMO_GROWER_NAMES) expect(names).not.toContain(name);
    expect(atlas.growers.every((g) => g.email.endsWith(`@${DEMO_ATLAS_EMAIL_DOMAIN}`) && /^[a-z.]+@/.test(g.email))).toBe(true);
    for (const v of DEMO_ATLAS_VARIETIES) expect(v.notes).toMatch(/^Fictional demo variety/);
    for (const r of atlas.reports) expect(varieties.has(r.varietyName), r.varietyName).toBe(true);
  });

  it('keeps every rule a grower’s report must keep (the form’s and the import’s rules)', () => {
    for (const r of atlas.reports) expect(reportRuleIssues(r), JSON.stringify(r)).toEqual([]);
    for (const r of atlas.reports) expect(r.createdAt <= NOW.toISOString()).toBe(true);
  });

  it('puts nothing in the editors’ queue by accident: the moderation rules find no report of it suspicious', () => {
    const ids = atlas.reports.map((r, i) => ({ ...r, id: i + 1, treeId: r.treeIndex + 1, varietyId: [...varieties.keys()].indexOf(r.varietyName) + 1 }));
    const catalogue = [...varieties.values()].map((v, i) => ({ id: i + 1, name: v.name, typicalDaysToRipen: v.typicalDaysToRipen }));
    expect(findSuspiciousReports(ids.filter((r) => r.status === 'published'), catalogue).size).toBe(0);
  });

  it('drops Smyrna crops and San Pedro main crops outside the wasp areas, and ripens some inside them', () => {
    const waspDependent = atlas.reports.filter((r) => r.crop === 'main' && ['smyrna', 'san-pedro'].includes(varieties.get(r.varietyName)!.figType));
    const outside = waspDependent.filter((r) => !inDemoWaspArea(r.lat, r.lon));
    const inside = waspDependent.filter((r) => inDemoWaspArea(r.lat, r.lon));
    expect(outside.length).toBeGreaterThan(100);
    expect(outside.every((r) => r.outcome === 'dropped' || r.outcome === 'no-fruit')).toBe(true);
    expect(inside.some((r) => r.outcome === 'ripened')).toBe(true);
    // a San Pedro breba needs no wasp: it ripens in the cold north too
    expect(atlas.reports.some((r) => r.crop === 'breba' && r.outcome === 'ripened' && varieties.get(r.varietyName)!.figType === 'san-pedro' && !inDemoWaspArea(r.lat, r.lon))).toBe(true);
  });

  it('ripens early varieties in short seasons and fails late ones there, which ripen in long seasons', () => {
    const main = atlas.reports.filter((r) => r.crop === 'main' && r.outcome !== 'no-fruit' && varieties.get(r.varietyName)!.figType === 'common');
    const short = main.filter((r) => townOf(r).seasonDays < 175 && r.form !== 'greenhouse');
    const long = main.filter((r) => townOf(r).seasonDays >= 215);
    const early = (r: { varietyName: string }) => varieties.get(r.varietyName)!.ripeningClass === 'early';
    const late = (r: { varietyName: string }) => varieties.get(r.varietyName)!.ripeningClass === 'late';
    expect(share(short.filter(early))).toBeGreaterThan(0.75);
    expect(share(short.filter(late))).toBeLessThan(0.2);
    expect(share(long.filter(late))).toBeGreaterThan(0.6);
    // a pot's head start shows: in short seasons, mid varieties ripen more often in containers than in the ground
    const mid = short.filter((r) => varieties.get(r.varietyName)!.ripeningClass === 'mid');
    expect(share(mid.filter((r) => r.form === 'container'))).toBeGreaterThan(share(mid.filter((r) => r.form === 'ground')));
  });

  it('shares a garden’s frost dates between its trees, and has breba and main crops, pinching and protection', () => {
    const byGardenSeason = new Map<string, Set<string>>();
    for (const r of atlas.reports) {
      if (!r.springFrostDate) continue;
      const key = `${r.growerIndex}:${r.season}`;
      byGardenSeason.set(key, (byGardenSeason.get(key) ?? new Set()).add(`${r.springFrostDate}/${r.fallFrostDate}`));
    }
    expect([...byGardenSeason.values()].every((dates) => dates.size === 1)).toBe(true);
    const count = (test: (r: (typeof atlas.reports)[number]) => boolean) => atlas.reports.filter(test).length;
    expect(count((r) => r.crop === 'breba')).toBeGreaterThan(400);
    expect(count((r) => r.pinched && r.pinchedDate !== null)).toBeGreaterThan(300);
    expect(count((r) => r.winterProtection !== '')).toBeGreaterThan(500);
    expect(count((r) => r.springFrostDate !== null)).toBeGreaterThan(1000);
    for (const form of ['ground', 'container', 'wall', 'greenhouse'] as const) expect(count((r) => r.form === form), form).toBeGreaterThan(100);
    // the moderation queue gets a little to do, drafts stay few
    expect(atlas.flags).toHaveLength(4);
    expect(atlas.hidden).toHaveLength(3);
    expect(count((r) => r.status === 'draft')).toBeGreaterThan(0);
    expect(count((r) => r.status === 'draft')).toBeLessThan(60);
  });
});

describe('the demo atlas in the database', { timeout: 120_000 }, () => {
  const { db, agent } = createTestContext();

  it('is seeded once beside the story, whose rows stay as they were', async () => {
    const storyOnly = createTestContext();
    await seedDatabase(storyOnly.db, { seedDemo: true, demoAtlas: false });
    await seedDatabase(db, { seedDemo: true });
    const sql = <T>(d: typeof db, q: string) => d.sqlite.prepare(q).all() as T[];
    const counts = () => sql(db, 'SELECT (SELECT count(*) FROM users) u, (SELECT count(*) FROM trees) t, (SELECT count(*) FROM reports) r, (SELECT count(*) FROM varieties) v, (SELECT count(*) FROM report_flags) f, (SELECT count(*) FROM audit_log) a')[0];
    const first = counts();
    await seedDatabase(db, { seedDemo: true });
    expect(counts()).toEqual(first);

    // The story's reports are the same rows with or without the crowd (tests and the README rely on them).
    const story = (d: typeof db) =>
      sql<Record<string, unknown>>(d, "SELECT u.email, v.name, r.lat, r.lon, r.season, r.crop, r.outcome, r.first_ripe_date FROM reports r JOIN users u ON u.id = r.user_id LEFT JOIN varieties v ON v.id = r.variety_id WHERE u.email NOT LIKE '%@atlas.demo.syconium.test' AND u.email NOT LIKE '%@coast.demo.syconium.test' ORDER BY r.id");
    expect(story(db)).toEqual(story(storyOnly.db));
    expect(story(db)).toHaveLength(356);
    // The cool-summer coast's invented growers (server/seed/demo-cool-coast.ts) come with the story, not the crowd.
    const coast = sql<{ n: number }>(db, "SELECT count(*) n FROM reports r JOIN users u ON u.id = r.user_id WHERE u.email LIKE '%@coast.demo.syconium.test'")[0]!.n;
    expect(coast).toBeGreaterThan(50);

    const atlasGrowers = sql<{ n: number }>(db, "SELECT count(*) n FROM users WHERE email LIKE '%@atlas.demo.syconium.test' AND is_demo = 1 AND role = 'grower'")[0]!.n;
    expect(atlasGrowers).toBe(atlas.growers.length);
    expect(sql<{ n: number }>(db, 'SELECT count(*) n FROM varieties WHERE is_fictional = 0')[0]!.n).toBe(0);
    expect(sql(db, "SELECT status, count(*) n FROM reports GROUP BY status ORDER BY status")).toEqual([
      { status: 'draft', n: atlas.reports.filter((r) => r.status === 'draft').length },
      { status: 'hidden', n: 3 },
      { status: 'published', n: 356 + coast + atlas.reports.filter((r) => r.status === 'published').length - 3 },
    ]);

    // Hidden by the demo editor, in the audit log as an editor's hide would be.
    const hides = sql<{ actor: string }>(db, "SELECT u.email actor FROM audit_log a JOIN users u ON u.id = a.actor_id WHERE a.action = 'report.hide'");
    expect(hides).toEqual(Array(3).fill({ actor: 'editor@demo.syconium.test' }));

    // The public list never shows an exact garden: only grid cells.
    const list = await agent().get('/api/reports?pageSize=100&seasonFrom=2021&seasonTo=2023');
    expect(list.status).toBe(200);
    expect(list.body.reports.length).toBe(100);
    expect(list.body.reports.every((r: { lat: unknown; lon: unknown }) => r.lat === null && r.lon === null)).toBe(true);
  });

  it('gives a demo town a ranking with something to rank: early figs on top, the wasp-dependent ones ranked down', async () => {
    await seedDatabase(db, { seedDemo: true }); // already there from the test above: adds nothing
    // Albany, NY, a short-season story town without the wasp, at the /here page's default radius
    const res = await agent().get('/api/atlas/near?lat=42.65&lon=-73.75&radiusKm=100');
    expect(res.status).toBe(200);
    const ranked: { name: string; rank: number; all: { trees: number } }[] = res.body.varieties;
    expect(ranked.length).toBeGreaterThanOrEqual(10);
    expect(ranked.reduce((sum, v) => sum + v.all.trees, 0)).toBeGreaterThan(80);
    const ranks = (test: (v: DemoVariety) => boolean) => ranked.filter((r) => test(varieties.get(r.name)!)).map((r) => r.rank);
    const earlyCommon = ranks((v) => v.figType === 'common' && v.ripeningClass === 'early');
    const waspDependent = ranks((v) => v.figType === 'smyrna' || v.figType === 'san-pedro');
    expect(earlyCommon.length).toBeGreaterThanOrEqual(3);
    expect(waspDependent.length).toBeGreaterThanOrEqual(2);
    expect(Math.min(...waspDependent)).toBeGreaterThan(Math.max(...earlyCommon));
    expect(ranked[0]!.rank).toBe(1);
    expect(earlyCommon).toContain(1);
  });
});
