/*
 * The demo scenario: invented growers in real towns, invented fig varieties (all marked fictional),
 * and a few seasons of reports generated from a simple, deterministic story. None of it is data
 * about real people or real cultivars; it exists only so a new user sees a living atlas.
 */
import type { FigType, RipeningClass } from '../../shared/domain/codes';

export const DEMO_PASSWORD = 'fig-demo-2026';

export const DEMO_ACCOUNTS = [
  { email: 'admin@demo.syconium.test', displayName: 'Rowan Admin (demo)', role: 'admin' },
  { email: 'editor@demo.syconium.test', displayName: 'Esme Quill (demo editor)', role: 'editor' },
  { email: 'grower@demo.syconium.test', displayName: 'Hollis Marrow (demo)', role: 'grower' },
] as const;

/** More invented growers who only exist to have written the demo reports. */
export const DEMO_GROWER_NAMES = [
  'Ines Talbot', 'Corwin Ashby', 'Mira Solano', 'Tobias Fenwick', 'Greta Lindqvist', 'Amos Pell',
  'Noor Haddad', 'Delia Crane', 'Pavel Orlov', 'Ruth Okafor', 'Silas Wren', 'Lena Moreau',
  'Otto Brandt', 'Yara Castell', 'Felix Oduya', 'Maren Holt', 'Jonah Reyes', 'Clio Barnaby',
  'Idris Kemal', 'Wilhelmina Shaw', 'Bram Janssen', 'Tamsin Vale', 'Hugo Almeida', 'Priya Natarajan',
] as const;

export interface DemoVariety {
  name: string;
  figType: FigType;
  bearsBreba: boolean;
  bearsMain: boolean;
  ripeningClass: RipeningClass | null;
  typicalDaysToRipen: number | null;
  synonyms: string[];
  notes: string;
}

export const DEMO_VARIETIES: DemoVariety[] = [
  { name: 'Lantern Amber', figType: 'common', bearsBreba: false, bearsMain: true, ripeningClass: 'early', typicalDaysToRipen: 125, synonyms: ['Amber Lantern'], notes: 'Fictional demo variety: a small yellow fig that ripens early.' },
  { name: 'Northgate Violet', figType: 'common', bearsBreba: true, bearsMain: true, ripeningClass: 'early', typicalDaysToRipen: 135, synonyms: [], notes: 'Fictional demo variety: hardy, bears a light breba crop.' },
  { name: 'Quillfield Black', figType: 'common', bearsBreba: false, bearsMain: true, ripeningClass: 'mid', typicalDaysToRipen: 160, synonyms: ['Quillfield'], notes: 'Fictional demo variety: dark skin, red pulp.' },
  { name: 'Marsh Honey', figType: 'common', bearsBreba: false, bearsMain: true, ripeningClass: 'mid', typicalDaysToRipen: 170, synonyms: [], notes: 'Fictional demo variety: green skin, amber pulp.' },
  { name: 'Solstice Green', figType: 'common', bearsBreba: true, bearsMain: true, ripeningClass: 'late', typicalDaysToRipen: 195, synonyms: [], notes: 'Fictional demo variety: large, late, needs a long warm season.' },
  { name: 'Cinder Rose', figType: 'san-pedro', bearsBreba: true, bearsMain: true, ripeningClass: 'mid', typicalDaysToRipen: 165, synonyms: [], notes: 'Fictional demo variety: its breba ripens anywhere it survives; its main crop needs the wasp.' },
  { name: 'Terrace Gold', figType: 'smyrna', bearsBreba: false, bearsMain: true, ripeningClass: 'late', typicalDaysToRipen: 185, synonyms: [], notes: 'Fictional demo variety: drops every fig where the wasp is absent.' },
  { name: 'Hollow Oak Capri', figType: 'caprifig', bearsBreba: true, bearsMain: true, ripeningClass: null, typicalDaysToRipen: null, synonyms: [], notes: 'Fictional demo caprifig: hosts the wasp, not for eating.' },
];

export interface DemoTown {
  name: string;
  lat: number;
  lon: number;
  /**
   * The story's frost-free days in the ground. Where real climate data covers the town (NOAA daily
   * records or normals within 50 km), the rounded estimate the atlas gives there; elsewhere
   * (Toronto, London) invented for the demo, not a climate value.
   */
  seasonDays: number;
  /** Day of year of the story's typical last spring frost (the same sources). */
  springFrostDoy: number;
  /** The story's heat in a typical year, growing degree days base 50 °F (the same sources); without it, days alone decide. */
  heatF?: number;
  waspEstablished: boolean;
}

export const DEMO_TOWNS: DemoTown[] = [
  { name: 'Albany, NY', lat: 42.65, lon: -73.75, seasonDays: 165, springFrostDoy: 118, heatF: 2590, waspEstablished: false },
  { name: 'Milwaukee, WI', lat: 43.04, lon: -87.91, seasonDays: 175, springFrostDoy: 112, heatF: 2720, waspEstablished: false },
  // No real data within 50 km: an invented station and invented figures.
  { name: 'Toronto, ON', lat: 43.65, lon: -79.38, seasonDays: 160, springFrostDoy: 120, heatF: 2500, waspEstablished: false },
  { name: 'Minneapolis, MN', lat: 44.98, lon: -93.27, seasonDays: 170, springFrostDoy: 114, heatF: 3060, waspEstablished: false },
  { name: 'Boston, MA', lat: 42.36, lon: -71.06, seasonDays: 196, springFrostDoy: 104, heatF: 2830, waspEstablished: false },
  { name: 'Philadelphia, PA', lat: 39.95, lon: -75.17, seasonDays: 233, springFrostDoy: 90, heatF: 4210, waspEstablished: false },
  // A long frost-free season and a cool summer: days enough for late figs, heat not.
  { name: 'Seattle, WA', lat: 47.61, lon: -122.33, seasonDays: 255, springFrostDoy: 70, heatF: 2160, waspEstablished: false },
  { name: 'Portland, OR', lat: 45.52, lon: -122.68, seasonDays: 274, springFrostDoy: 58, heatF: 2610, waspEstablished: false },
  { name: 'Sacramento, CA', lat: 38.58, lon: -121.49, seasonDays: 317, springFrostDoy: 31, heatF: 4690, waspEstablished: true },
  { name: 'Fresno, CA', lat: 36.74, lon: -119.79, seasonDays: 309, springFrostDoy: 34, heatF: 5470, waspEstablished: true },
  { name: 'Austin, TX', lat: 30.27, lon: -97.74, seasonDays: 278, springFrostDoy: 57, heatF: 7020, waspEstablished: false },
  // No real data: invented figures (heat roughly that of a mild maritime climate).
  { name: 'London, UK', lat: 51.51, lon: -0.13, seasonDays: 200, springFrostDoy: 95, heatF: 1900, waspEstablished: false },
];

/**
 * The demo's cool-summer coastal town: invented growers on the north coast of California, where
 * NOAA's normals give a frost-free season of about 300 days and barely 1,450 growing degree days.
 * Late figs stay hard however long the season is; early ones ripen mostly in pots, on warm walls
 * or under cover.
 */
export const DEMO_COOL_COAST_TOWN: DemoTown = { name: 'Eureka, CA', lat: 40.8, lon: -124.16, seasonDays: 306, springFrostDoy: 46, heatF: 1444, waspEstablished: false };
export const DEMO_COOL_COAST_GROWERS = ['Ansel Moravec', 'Petra Lindgren', 'Caspar Ngata', 'Oriel Fane', 'Brisa Ocampo', 'Tomas Weller'] as const;

export const DEMO_SEASONS = [2021, 2022, 2023, 2024, 2025] as const;

/** Demo wasp areas: invented records (with invented sources) that cover the story's wasp towns. */
export const DEMO_WASP_AREAS = [
  {
    name: 'Lower Sacramento Valley (demo)',
    source: 'Demo scenario: invented survey note, not a real observation',
    observedOn: '2024-07-15',
    coordinates: [[[-122.1, 38.1], [-121.0, 38.05], [-120.9, 39.0], [-121.6, 39.3], [-122.2, 38.9], [-122.1, 38.1]]],
  },
  {
    name: 'Fresno basin (demo)',
    source: 'Demo scenario: invented extension-office record, not a real observation',
    observedOn: '2023-08-02',
    coordinates: [[[-120.4, 36.4], [-119.3, 36.3], [-119.2, 37.1], [-119.9, 37.2], [-120.4, 36.4]]],
  },
];

/**
 * The story's heat need of a variety's main crop, growing degree days base 50 °F from the last
 * spring frost to the first ripe fig: its typical days at 12 °F-days a day (invented for the demo).
 */
export const storyHeatNeedF = (variety: Pick<DemoVariety, 'typicalDaysToRipen'>) => Math.round((variety.typicalDaysToRipen ?? 170) * 12);

/** How much warmer each growing form is than a tree in the ground, as a factor on heat (invented for the demo). */
export const STORY_FORM_HEAT_FACTOR = { ground: 1, container: 1.05, wall: 1.15, greenhouse: 1.5 } as const;

/**
 * The chance the story gives a main crop to ripen on heat alone: 1 with enough heat to spare, 0
 * well short of it; 1 where the town has no heat figure (days alone decide there).
 */
export function storyHeatChance(town: Pick<DemoTown, 'heatF'>, variety: Pick<DemoVariety, 'typicalDaysToRipen'>, form: keyof typeof STORY_FORM_HEAT_FACTOR, noise: number): number {
  if (town.heatF === undefined) return 1;
  const available = town.heatF * STORY_FORM_HEAT_FACTOR[form] * (1 + noise * 0.05);
  return Math.min(1, Math.max(0, (available - (storyHeatNeedF(variety) - 100)) / 250));
}
