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
  /** The story's frost-free days in the ground (invented for the demo, not a climate value). */
  seasonDays: number;
  /** Day of year of the story's typical last spring frost. */
  springFrostDoy: number;
  waspEstablished: boolean;
}

export const DEMO_TOWNS: DemoTown[] = [
  { name: 'Albany, NY', lat: 42.65, lon: -73.75, seasonDays: 165, springFrostDoy: 118, waspEstablished: false },
  { name: 'Milwaukee, WI', lat: 43.04, lon: -87.91, seasonDays: 175, springFrostDoy: 112, waspEstablished: false },
  { name: 'Toronto, ON', lat: 43.65, lon: -79.38, seasonDays: 160, springFrostDoy: 120, waspEstablished: false },
  { name: 'Minneapolis, MN', lat: 44.98, lon: -93.27, seasonDays: 150, springFrostDoy: 125, waspEstablished: false },
  { name: 'Boston, MA', lat: 42.36, lon: -71.06, seasonDays: 190, springFrostDoy: 105, waspEstablished: false },
  { name: 'Philadelphia, PA', lat: 39.95, lon: -75.17, seasonDays: 210, springFrostDoy: 95, waspEstablished: false },
  { name: 'Seattle, WA', lat: 47.61, lon: -122.33, seasonDays: 170, springFrostDoy: 100, waspEstablished: false },
  { name: 'Portland, OR', lat: 45.52, lon: -122.68, seasonDays: 195, springFrostDoy: 98, waspEstablished: false },
  { name: 'Sacramento, CA', lat: 38.58, lon: -121.49, seasonDays: 275, springFrostDoy: 60, waspEstablished: true },
  { name: 'Fresno, CA', lat: 36.74, lon: -119.79, seasonDays: 280, springFrostDoy: 58, waspEstablished: true },
  { name: 'Austin, TX', lat: 30.27, lon: -97.74, seasonDays: 270, springFrostDoy: 60, waspEstablished: false },
  { name: 'London, UK', lat: 51.51, lon: -0.13, seasonDays: 200, springFrostDoy: 95, waspEstablished: false },
];

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
