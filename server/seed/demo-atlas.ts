import { booleanPointInPolygon, point } from '@turf/turf';
import type { Crop, GrowingForm, Outcome, ReportStatus } from '../../shared/domain/codes';
import { toPublicPoint } from '../../shared/domain/public-grid';
import {
  DEMO_ATLAS_EMAIL_DOMAIN,
  DEMO_ATLAS_FAMILY_NAMES,
  DEMO_ATLAS_FLAG_REASONS,
  DEMO_ATLAS_GIVEN_NAMES,
  DEMO_ATLAS_GROWERS,
  DEMO_ATLAS_HIDDEN,
  DEMO_ATLAS_TOWNS,
  DEMO_ATLAS_VARIETIES,
  FEEDING,
  NOTES,
  WATERING,
  WINTER_PROTECTION,
} from './demo-atlas-scenario';
import { DEMO_ACCOUNTS, DEMO_GROWER_NAMES, DEMO_SEASONS, DEMO_TOWNS, DEMO_VARIETIES, DEMO_WASP_AREAS, storyHeatChance, type DemoVariety } from './demo-scenario';
import { round5, type DemoReport } from './demo-reports';
import { pick, seededRandom } from './random';

/*
 * The demo atlas: a deterministic crowd of invented growers around the demo story. Pure: the same
 * seed gives the same growers, trees and reports on every machine; server/seed/demo-atlas-seed.ts
 * writes them. The story's rules, in short:
 *  - a garden shares its frost dates and season length between its trees (a year's weather is
 *    shared by a whole region, a garden adds its own few days);
 *  - the main crop ripens when the season, plus the growing form's head start and pinching, covers
 *    the variety's days; close calls go either way;
 *  - Smyrna crops and San Pedro main crops drop outside the demo wasp areas;
 *  - the breba needs last year's wood: a hard winter kills it back in cold towns unless the tree is
 *    protected or in a pot wintered indoors (and the main crop then starts late);
 *  - young seedlings and tissue-culture plants bear nothing for a few years.
 */

export interface AtlasGrower {
  name: string;
  email: string;
  verified: boolean;
  town: string;
}

export interface AtlasTree {
  growerIndex: number;
  label: string;
}

/** A report of the demo atlas: the story's report shape, on a numbered tree, with practices and a status. */
export interface AtlasReport extends Omit<DemoReport, 'treeKey'> {
  treeIndex: number;
  winterProtection: string;
  feeding: string;
  watering: string;
  status: Extract<ReportStatus, 'published' | 'draft'>;
  /** When the grower posted it: after the crop's season (never after `now`). */
  createdAt: string;
}

export interface DemoAtlas {
  growers: AtlasGrower[];
  trees: AtlasTree[];
  reports: AtlasReport[];
  /** Open flags other demo growers raised (indexes into `reports` and `growers`). */
  flags: { reportIndex: number; growerIndex: number; reason: string }[];
  /** Reports the demo editor hid, with the reason the author sees. */
  hidden: { reportIndex: number; reason: string }[];
}

interface AtlasTown {
  name: string;
  lat: number;
  lon: number;
  seasonDays: number;
  springFrostDoy: number;
  /** Heat in a typical year (GDD base 50 °F) where the story gives one. */
  heatF?: number;
  weight: number;
}

/** Days of head start a growing form gives in the story (a pot warms early, a greenhouse more). */
const HEAD_START: Record<GrowingForm, number> = { ground: 0, container: 21, wall: 14, greenhouse: 45 };
/** Days pinching the tips gains in the story. */
const PINCH_GAIN = 8;
/** Days a tree killed back to the ground loses before its main crop starts. */
const DIEBACK_LOSS = 18;
/** The character of each demo season, shared by every town: 2023 was a cool one. */
const YEAR_SHIFT: Record<number, number> = { 2021: 4, 2022: -2, 2023: -11, 2024: 9, 2025: 1 };

/** 'YYYY-MM-DD' of a day of the year (kept within the year). */
function isoDate(year: number, dayOfYear: number): string {
  const day = Math.max(1, Math.min(365, Math.round(dayOfYear)));
  return new Date(Date.UTC(year, 0, day)).toISOString().slice(0, 10);
}

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/** An e-mail local part from a name: ASCII letters only ("Sørlie" becomes "sorlie"). */
function slug(name: string): string {
  return name
    .normalize('NFD')
    .replace(/\p{M}/gu, '')
    .replace(/ø/gi, 'o')
    .toLowerCase()
    .replace(/[^a-z]+/g, '.')
    .replace(/^\.|\.$/g, '');
}

/** Whether a point lies in one of the demo wasp areas (the story's only wasp records). */
export function inDemoWaspArea(lat: number, lon: number): boolean {
  return WASP_POLYGONS.some(({ box, polygon }) => lat >= box.minLat && lat <= box.maxLat && lon >= box.minLon && lon <= box.maxLon && booleanPointInPolygon(point([lon, lat]), polygon));
}

const WASP_POLYGONS = DEMO_WASP_AREAS.map(({ coordinates }) => {
  const ring = coordinates[0]!;
  const lats = ring.map((p) => p[1]!);
  const lons = ring.map((p) => p[0]!);
  return {
    polygon: { type: 'Polygon' as const, coordinates },
    box: { minLat: Math.min(...lats), maxLat: Math.max(...lats), minLon: Math.min(...lons), maxLon: Math.max(...lons) },
  };
});

function weightedPick<T>(random: () => number, items: readonly T[], weight: (item: T) => number): T {
  const weights = items.map(weight);
  let r = random() * weights.reduce((a, b) => a + b, 0);
  for (let i = 0; i < items.length; i++) {
    r -= weights[i]!;
    if (r < 0) return items[i]!;
  }
  return items[items.length - 1]!;
}

/** How likely a grower in a town picks a variety: short seasons lean to early figs, wasp areas to Smyrna. */
function varietyWeight(variety: DemoVariety, seasonDays: number, wasp: boolean): number {
  const popularity = { early: 3, mid: 2, late: 1 }[variety.ripeningClass ?? 'mid'];
  let w = popularity;
  if (seasonDays < 175) w *= variety.ripeningClass === 'early' ? 1.6 : variety.ripeningClass === 'late' ? 0.6 : 1;
  else if (seasonDays >= 230) w *= variety.ripeningClass === 'late' ? 1.6 : variety.ripeningClass === 'early' ? 0.7 : 1;
  if (variety.figType === 'smyrna') w *= wasp ? 2.5 : 0.5;
  if (variety.figType === 'san-pedro') w *= wasp ? 1.6 : 0.8;
  return w;
}

function formFor(random: () => number, seasonDays: number): GrowingForm {
  const r = random();
  if (seasonDays < 170) return r < 0.4 ? 'ground' : r < 0.8 ? 'container' : r < 0.91 ? 'wall' : 'greenhouse';
  if (seasonDays < 215) return r < 0.58 ? 'ground' : r < 0.82 ? 'container' : r < 0.95 ? 'wall' : 'greenhouse';
  return r < 0.86 ? 'ground' : r < 0.97 ? 'container' : 'wall';
}

const TREE_LABELS: Record<GrowingForm, string[]> = {
  ground: ['by the back fence', 'in the front yard', 'by the driveway', 'near the shed', 'at the allotment'],
  wall: ['on the south wall', 'against the garage', 'by the brick wall'],
  container: ['in the big pot', 'patio pot', 'in the half barrel', 'on the balcony'],
  greenhouse: ['in the greenhouse', 'in the hoop house'],
};

/**
 * Build the demo atlas. `now` bounds the posting dates (a season's reports are posted after it,
 * but never in the future).
 */
export function buildDemoAtlas(options: { growers?: number; seed?: number; now?: Date } = {}): DemoAtlas {
  const growerCount = options.growers ?? DEMO_ATLAS_GROWERS;
  const seed = options.seed ?? 20261203;
  // Who lives where comes from its own stream, so tuning the story below never moves a garden.
  const placeRandom = seededRandom(seed + 1);
  const random = seededRandom(seed);
  const nowIso = (options.now ?? new Date()).toISOString();
  const gaussOf = (r: () => number) => () => Math.sqrt(-2 * Math.log(1 - r())) * Math.cos(2 * Math.PI * r());
  const gauss = gaussOf(random);
  const placeGauss = gaussOf(placeRandom);
  const varieties = [...DEMO_VARIETIES, ...DEMO_ATLAS_VARIETIES].filter((v) => v.figType !== 'caprifig');

  // The story's own towns first (more growers each), then the towns around them.
  const towns: AtlasTown[] = [
    // Albany, NY (the demo grower's home) and Milwaukee, WI have real stations: the most growers.
    ...DEMO_TOWNS.map((t) => ({ ...t, weight: t.name === 'Albany, NY' ? 5 : t.name === 'Milwaukee, WI' ? 4 : 3 })),
    ...DEMO_ATLAS_TOWNS.map((t) => ({ ...t, weight: 1.2 })),
  ];
  // Each town's seasons: the year's character plus the town's own luck that year.
  const townYear = new Map<string, { season: number; spring: number }>();
  for (const town of towns) {
    for (const season of DEMO_SEASONS) {
      const shift = YEAR_SHIFT[season]! + gauss() * 5;
      townYear.set(`${town.name}:${season}`, { season: town.seasonDays + shift, spring: town.springFrostDoy - shift / 2 + gauss() * 4 });
    }
  }

  const taken = new Set<string>([...DEMO_GROWER_NAMES, ...DEMO_ACCOUNTS.map((a) => a.displayName.replace(/ \(.*$/, ''))]);
  const growers: AtlasGrower[] = [];
  const trees: AtlasTree[] = [];
  const reports: AtlasReport[] = [];

  for (let g = 0; g < growerCount; g++) {
    let name: string;
    do name = `${pick(placeRandom, DEMO_ATLAS_GIVEN_NAMES)} ${pick(placeRandom, DEMO_ATLAS_FAMILY_NAMES)}`;
    while (taken.has(name));
    taken.add(name);
    const town = weightedPick(placeRandom, towns, (t) => t.weight);
    const verified = g % 150 !== 149; // two growers never confirmed their address: their reports wait as drafts
    growers.push({ name, email: `${slug(name)}@${DEMO_ATLAS_EMAIL_DOMAIN}`, verified, town: town.name });

    // A garden within about 30 km of the town centre, most of them closer.
    const lat = town.lat + clamp(placeGauss() * 0.1, -0.28, 0.28);
    const lon = town.lon + clamp((placeGauss() * 0.1) / Math.cos((town.lat * Math.PI) / 180), -0.38, 0.38);
    const grid = toPublicPoint(lat, lon);
    const wasp = inDemoWaspArea(lat, lon);
    const garden = gauss() * 5; // a sheltered yard or a frost pocket
    const keen = random() < 0.25;
    const treeCount = keen ? 2 + Math.floor(random() * 3) : random() < 0.6 ? 1 : 2;
    const recordsFrost = random() < (keen ? 0.85 : 0.45);
    const joined = keen ? DEMO_SEASONS[0] : DEMO_SEASONS[0] + Math.floor(random() * 4);
    const latePoster = verified && random() < 0.015; // this season's reports still waiting as drafts
    const cold = town.seasonDays < 200;

    for (let t = 0; t < treeCount; t++) {
      const variety = weightedPick(random, varieties, (v) => varietyWeight(v, town.seasonDays, wasp));
      const form = formFor(random, town.seasonDays);
      const origin = weightedPick(random, ['cutting', 'air-layer', 'graft', 'tissue-culture', 'seedling', 'unknown'] as const, (o) => ({ cutting: 55, 'air-layer': 15, graft: 5, 'tissue-culture': 14, seedling: 3, unknown: 8 })[o]);
      const yearPlanted = 2024 - Math.floor(random() ** 1.4 * 12);
      const protectedTree = (form === 'ground' || form === 'wall') && cold && random() < (keen ? 0.85 : 0.55);
      const winterProtection =
        form === 'container' && cold
          ? pick(random, WINTER_PROTECTION.container)
          : protectedTree
            ? pick(random, form === 'wall' ? WINTER_PROTECTION.wall : WINTER_PROTECTION.ground)
            : form === 'greenhouse' && random() < 0.5
              ? pick(random, WINTER_PROTECTION.greenhouse)
              : '';
      const feeding = random() < 0.4 ? pick(random, FEEDING) : '';
      const watering = random() < (form === 'container' ? 0.6 : 0.3) ? pick(random, WATERING) : '';
      const treeIndex = trees.length;
      trees.push({ growerIndex: g, label: `${variety.name} ${pick(random, TREE_LABELS[form])}` });

      for (const season of DEMO_SEASONS) {
        if (season <= yearPlanted || season < joined || (!keen && random() < 0.25)) continue;
        const year = townYear.get(`${town.name}:${season}`)!;
        const springDoy = Math.round(year.spring - garden / 3);
        const seasonDays = Math.round(year.season + garden);
        const fallDoy = Math.min(364, springDoy + seasonDays);
        const age = season - yearPlanted;
        const juvenile = (origin === 'seedling' && age < 5) || (origin === 'tissue-culture' && age < 3);
        // Winter kill: a tree in the ground in a cold town dies back unless it was protected.
        const diebackChance = !cold || form === 'greenhouse' || form === 'container' ? 0.02 : protectedTree ? 0.12 : town.seasonDays < 165 ? 0.65 : 0.35;
        const dieback = random() < diebackChance;
        const pinched = random() < (keen ? 0.7 : 0.2);
        const status: AtlasReport['status'] = !verified || (latePoster && season === DEMO_SEASONS[DEMO_SEASONS.length - 1]) ? 'draft' : 'published';

        const report = (crop: Crop, outcome: Outcome, ripeDoy: number | null, harvestDoy: number | null, note: string, postedDoy: number): AtlasReport => ({
          growerIndex: g,
          treeIndex,
          varietyName: variety.name,
          lat: round5(lat),
          lon: round5(lon),
          gridLat: grid.lat,
          gridLon: grid.lon,
          form,
          origin,
          yearPlanted,
          season,
          crop,
          outcome,
          firstRipeDate: ripeDoy === null ? null : isoDate(season, ripeDoy),
          lastHarvestDate: harvestDoy === null ? null : isoDate(season, harvestDoy),
          springFrostDate: recordsFrost ? isoDate(season, springDoy) : null,
          fallFrostDate: recordsFrost ? isoDate(season, fallDoy) : null,
          pinched: crop === 'main' && pinched,
          pinchedDate: crop === 'main' && pinched ? isoDate(season, 172 + Math.floor(random() * 18)) : null,
          winterProtection,
          feeding,
          watering,
          notes: note,
          status,
          createdAt: postedAt(season, postedDoy, random, nowIso),
        });
        const noteFor = (outcome: Outcome) => (random() < 0.3 ? pick(random, NOTES[outcome]) : '');

        // Breba: on last year's wood, so a tree of two years or more, and only what survived the winter.
        if (variety.bearsBreba && age >= 2 && random() < 0.85) {
          let outcome: Outcome;
          if (juvenile || dieback) outcome = 'no-fruit';
          else if (!cold || form === 'container' || form === 'greenhouse' || protectedTree) outcome = random() < 0.82 ? 'ripened' : random() < 0.6 ? 'dropped' : 'no-fruit';
          else outcome = random() < 0.45 ? 'ripened' : random() < 0.4 ? 'dropped' : 'no-fruit';
          const ripe = outcome === 'ripened' ? Math.min(fallDoy - 40, springDoy + 52 - Math.round(HEAD_START[form] / 3) + Math.round(gauss() * 6)) : null;
          const harvest = ripe === null ? null : Math.min(fallDoy, ripe + 8 + Math.floor(random() * 18));
          const note = outcome === 'ripened' && protectedTree && random() < 0.4 ? pick(random, NOTES.breba) : dieback && random() < 0.5 ? NOTES['no-fruit'][1] : noteFor(outcome);
          reports.push(report('breba', outcome, ripe, harvest, note, (harvest ?? springDoy + 80) + 10));
        }

        // Main crop.
        let outcome: Outcome;
        const need = variety.typicalDaysToRipen ?? 170;
        const start = HEAD_START[form] + (pinched ? PINCH_GAIN : 0) - (dieback ? DIEBACK_LOSS : 0);
        const needsWasp = variety.figType === 'smyrna' || variety.figType === 'san-pedro';
        if (juvenile || (age <= 1 && random() < 0.4)) outcome = 'no-fruit';
        else if (needsWasp && !wasp) outcome = 'dropped';
        else if (random() < 0.04) outcome = 'dropped'; // a dry July, or roots standing in water
        else {
          const available = seasonDays + start + gauss() * 6;
          // Days and, where the town has a heat figure, heat: a long cool season is not enough.
          const chance = Math.min(clamp((available - (need - 5)) / 20, 0, 1), storyHeatChance(town, variety, form, gauss()));
          outcome = random() < chance ? 'ripened' : 'unripe';
        }
        let ripe: number | null = null;
        let harvest: number | null = null;
        if (outcome === 'ripened') {
          ripe = Math.round(springDoy + need - start + gauss() * 5);
          ripe = Math.min(ripe, fallDoy - 3 - Math.floor(random() * 8));
          harvest = Math.min(fallDoy, ripe + 15 + Math.floor(random() * 30));
          // Squeezed against the frost far earlier than the variety can ripen: it did not make it.
          if (form !== 'greenhouse' && ripe - springDoy < Math.ceil(0.62 * need)) {
            outcome = 'unripe';
            ripe = harvest = null;
          }
        }
        const note = dieback && random() < 0.5 ? NOTES['no-fruit'][1] : noteFor(outcome);
        reports.push(report('main', outcome, ripe, harvest, note, Math.max(harvest ?? 0, fallDoy) + 5));
      }
    }
  }

  return { growers, trees, reports, ...moderation(reports, growers, random) };
}

/** A posting time a few days to weeks after `doy` of the season, never later than `nowIso`. */
function postedAt(season: number, doy: number, random: () => number, nowIso: string): string {
  const day = Math.min(364, doy + Math.floor(random() * 25));
  const at = `${isoDate(season, day)}T${String(7 + Math.floor(random() * 14)).padStart(2, '0')}:${String(Math.floor(random() * 60)).padStart(2, '0')}:00.000Z`;
  return at < nowIso ? at : nowIso;
}

/**
 * The moderation part of the crowd: a few published reports flagged by other growers, a few hidden
 * by the editor, one of them a duplicate the grower posted twice.
 */
function moderation(reports: AtlasReport[], growers: AtlasGrower[], random: () => number): Pick<DemoAtlas, 'flags' | 'hidden'> {
  const published = reports.map((r, i) => ({ r, i })).filter(({ r }) => r.status === 'published');
  const chosen = new Set<number>();
  const choose = (accept: (r: AtlasReport) => boolean): number => {
    const candidates = published.filter(({ r, i }) => !chosen.has(i) && accept(r));
    const { i } = candidates[Math.floor(random() * candidates.length)]!;
    chosen.add(i);
    return i;
  };
  const ripenedMain = (r: AtlasReport) => r.crop === 'main' && r.outcome === 'ripened';
  // each reason on a report it could be about
  const flagged: ((r: AtlasReport) => boolean)[] = [
    (r) => ripenedMain(r) && r.form === 'ground' && r.lat > 43,
    ripenedMain,
    (r) => ripenedMain(r) && r.season - r.yearPlanted <= 1,
    ripenedMain,
  ];
  const flags = DEMO_ATLAS_FLAG_REASONS.map((reason, k) => {
    const reportIndex = choose(flagged[k]!);
    const owner = reports[reportIndex]!.growerIndex;
    let growerIndex = Math.floor(random() * growers.length);
    while (growerIndex === owner || !growers[growerIndex]!.verified) growerIndex = (growerIndex + 1) % growers.length;
    return { reportIndex, growerIndex, reason };
  });

  // The duplicate: the same tree, season and crop posted a second time, a day later.
  const original = reports[choose(ripenedMain)]!;
  reports.push({ ...original, createdAt: original.createdAt.replace(/T\d\d/, 'T22') });
  const [duplicate, ...others] = DEMO_ATLAS_HIDDEN;
  const hidden: DemoAtlas['hidden'] = [{ reportIndex: reports.length - 1, reason: duplicate.reason }];
  for (const { reason, notes } of others) {
    const reportIndex = choose((r) => r.crop === 'main');
    reports[reportIndex]!.notes = notes;
    hidden.push({ reportIndex, reason });
  }
  return { flags, hidden };
}
