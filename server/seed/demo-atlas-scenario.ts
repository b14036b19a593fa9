/*
 * The demo atlas: the crowd around the demo story (server/seed/demo-scenario.ts). Several hundred
 * invented growers in the story's towns and more towns of the same regions, more invented varieties
 * (all marked fictional), and the practices and notes their reports mention. None of it is data
 * about real people, real gardens or real cultivars; season lengths and frost days are the story's
 * own round figures, not climate values.
 */
import type { DemoTown, DemoVariety } from './demo-scenario';

/** The demo atlas's growers write from this e-mail domain; it marks their accounts (idempotence). */
export const DEMO_ATLAS_EMAIL_DOMAIN = 'atlas.demo.syconium.test';

/** How many invented growers the demo atlas adds to the story's 25. */
export const DEMO_ATLAS_GROWERS = 420;

/** More invented varieties, so a town's ranking has early, mid and late, common, San Pedro and Smyrna. */
export const DEMO_ATLAS_VARIETIES: DemoVariety[] = [
  { name: 'Pebblestone Brown', figType: 'common', bearsBreba: true, bearsMain: true, ripeningClass: 'early', typicalDaysToRipen: 118, synonyms: ['Pebblestone'], notes: 'Fictional demo variety: small brown figs on a compact tree; the short-season favourite of the demo.' },
  { name: 'Wrenhaven Purple', figType: 'common', bearsBreba: false, bearsMain: true, ripeningClass: 'early', typicalDaysToRipen: 132, synonyms: [], notes: 'Fictional demo variety: purple skin, strawberry pulp, ripens reliably in pots.' },
  { name: 'Lamplight Honey', figType: 'common', bearsBreba: true, bearsMain: true, ripeningClass: 'mid', typicalDaysToRipen: 152, synonyms: ['Lamplight'], notes: 'Fictional demo variety: yellow-green, honey pulp, a good breba where the wood survives.' },
  { name: 'Ferrule Green', figType: 'common', bearsBreba: false, bearsMain: true, ripeningClass: 'late', typicalDaysToRipen: 210, synonyms: [], notes: 'Fictional demo variety: large green figs that need a long, hot season.' },
  { name: 'Saltgrass Blanc', figType: 'san-pedro', bearsBreba: true, bearsMain: true, ripeningClass: 'mid', typicalDaysToRipen: 170, synonyms: [], notes: 'Fictional demo variety: a heavy breba anywhere; the main crop drops without the fig wasp.' },
  { name: 'Quarry Sun', figType: 'smyrna', bearsBreba: false, bearsMain: true, ripeningClass: 'late', typicalDaysToRipen: 190, synonyms: [], notes: 'Fictional demo variety: a drying fig that sets nothing without the fig wasp.' },
];

/**
 * More towns in the story's regions (the north-east of the USA and the Great Lakes, the Upper
 * Midwest, the Pacific Northwest, California, Texas, the British Isles) and a few in north-west
 * Europe. `waspEstablished` is not set here: the seed asks the demo wasp areas about each garden.
 */
export const DEMO_ATLAS_TOWNS: Omit<DemoTown, 'waspEstablished'>[] = [
  // north-east USA, Ontario and Quebec
  { name: 'Schenectady, NY', lat: 42.81, lon: -73.94, seasonDays: 160, springFrostDoy: 121 },
  { name: 'Troy, NY', lat: 42.73, lon: -73.69, seasonDays: 162, springFrostDoy: 120 },
  { name: 'Saratoga Springs, NY', lat: 43.08, lon: -73.78, seasonDays: 148, springFrostDoy: 127 },
  { name: 'Hudson, NY', lat: 42.25, lon: -73.79, seasonDays: 170, springFrostDoy: 115 },
  { name: 'Kingston, NY', lat: 41.93, lon: -74.0, seasonDays: 172, springFrostDoy: 113 },
  { name: 'Poughkeepsie, NY', lat: 41.7, lon: -73.92, seasonDays: 178, springFrostDoy: 110 },
  { name: 'Pittsfield, MA', lat: 42.45, lon: -73.25, seasonDays: 142, springFrostDoy: 130 },
  { name: 'Springfield, MA', lat: 42.1, lon: -72.59, seasonDays: 170, springFrostDoy: 114 },
  { name: 'Worcester, MA', lat: 42.26, lon: -71.8, seasonDays: 165, springFrostDoy: 117 },
  { name: 'Hartford, CT', lat: 41.76, lon: -72.68, seasonDays: 175, springFrostDoy: 112 },
  { name: 'Providence, RI', lat: 41.82, lon: -71.41, seasonDays: 190, springFrostDoy: 106 },
  { name: 'New York, NY', lat: 40.71, lon: -74.01, seasonDays: 225, springFrostDoy: 92 },
  { name: 'Newark, NJ', lat: 40.74, lon: -74.17, seasonDays: 212, springFrostDoy: 97 },
  { name: 'Burlington, VT', lat: 44.48, lon: -73.21, seasonDays: 150, springFrostDoy: 127 },
  { name: 'Portland, ME', lat: 43.66, lon: -70.26, seasonDays: 155, springFrostDoy: 124 },
  { name: 'Syracuse, NY', lat: 43.05, lon: -76.15, seasonDays: 165, springFrostDoy: 118 },
  { name: 'Rochester, NY', lat: 43.16, lon: -77.61, seasonDays: 170, springFrostDoy: 116 },
  { name: 'Buffalo, NY', lat: 42.89, lon: -78.88, seasonDays: 175, springFrostDoy: 113 },
  { name: 'Pittsburgh, PA', lat: 40.44, lon: -80.0, seasonDays: 180, springFrostDoy: 110 },
  { name: 'Baltimore, MD', lat: 39.29, lon: -76.61, seasonDays: 205, springFrostDoy: 98 },
  { name: 'Washington, DC', lat: 38.91, lon: -77.04, seasonDays: 210, springFrostDoy: 95 },
  { name: 'Hamilton, ON', lat: 43.26, lon: -79.87, seasonDays: 170, springFrostDoy: 115 },
  { name: 'Ottawa, ON', lat: 45.42, lon: -75.7, seasonDays: 150, springFrostDoy: 126 },
  { name: 'Montreal, QC', lat: 45.5, lon: -73.57, seasonDays: 155, springFrostDoy: 124 },
  // Great Lakes and Upper Midwest
  { name: 'Cleveland, OH', lat: 41.5, lon: -81.69, seasonDays: 190, springFrostDoy: 108 },
  { name: 'Detroit, MI', lat: 42.33, lon: -83.05, seasonDays: 180, springFrostDoy: 110 },
  { name: 'Chicago, IL', lat: 41.88, lon: -87.63, seasonDays: 190, springFrostDoy: 106 },
  { name: 'Madison, WI', lat: 43.07, lon: -89.4, seasonDays: 155, springFrostDoy: 123 },
  { name: 'St. Cloud, MN', lat: 45.56, lon: -94.16, seasonDays: 140, springFrostDoy: 130 },
  // Pacific Northwest
  { name: 'Tacoma, WA', lat: 47.25, lon: -122.44, seasonDays: 180, springFrostDoy: 98 },
  { name: 'Olympia, WA', lat: 47.04, lon: -122.9, seasonDays: 160, springFrostDoy: 110 },
  { name: 'Vancouver, BC', lat: 49.28, lon: -123.12, seasonDays: 200, springFrostDoy: 90 },
  { name: 'Victoria, BC', lat: 48.43, lon: -123.37, seasonDays: 215, springFrostDoy: 85 },
  { name: 'Salem, OR', lat: 44.94, lon: -123.03, seasonDays: 185, springFrostDoy: 105 },
  { name: 'Eugene, OR', lat: 44.05, lon: -123.09, seasonDays: 180, springFrostDoy: 108 },
  // California (Davis, Elk Grove and Clovis lie inside the demo wasp areas; Modesto and Santa Rosa do not)
  { name: 'Davis, CA', lat: 38.54, lon: -121.74, seasonDays: 255, springFrostDoy: 68 },
  { name: 'Elk Grove, CA', lat: 38.41, lon: -121.37, seasonDays: 265, springFrostDoy: 64 },
  { name: 'Clovis, CA', lat: 36.83, lon: -119.7, seasonDays: 270, springFrostDoy: 62 },
  { name: 'Modesto, CA', lat: 37.64, lon: -121.0, seasonDays: 265, springFrostDoy: 63 },
  { name: 'Santa Rosa, CA', lat: 38.44, lon: -122.71, seasonDays: 230, springFrostDoy: 80 },
  // Texas
  { name: 'San Antonio, TX', lat: 29.42, lon: -98.49, seasonDays: 265, springFrostDoy: 60 },
  { name: 'Houston, TX', lat: 29.76, lon: -95.37, seasonDays: 290, springFrostDoy: 45 },
  { name: 'Dallas, TX', lat: 32.78, lon: -96.8, seasonDays: 235, springFrostDoy: 75 },
  // British Isles and north-west Europe
  { name: 'Bristol, UK', lat: 51.45, lon: -2.59, seasonDays: 200, springFrostDoy: 96 },
  { name: 'Brighton, UK', lat: 50.82, lon: -0.14, seasonDays: 215, springFrostDoy: 88 },
  { name: 'Manchester, UK', lat: 53.48, lon: -2.24, seasonDays: 185, springFrostDoy: 105 },
  { name: 'Dublin, IE', lat: 53.35, lon: -6.26, seasonDays: 190, springFrostDoy: 100 },
  { name: 'Paris, FR', lat: 48.86, lon: 2.35, seasonDays: 205, springFrostDoy: 92 },
  { name: 'Brussels, BE', lat: 50.85, lon: 4.35, seasonDays: 190, springFrostDoy: 102 },
  { name: 'Amsterdam, NL', lat: 52.37, lon: 4.9, seasonDays: 185, springFrostDoy: 104 },
  { name: 'Cologne, DE', lat: 50.94, lon: 6.96, seasonDays: 195, springFrostDoy: 100 },
  { name: 'Copenhagen, DK', lat: 55.68, lon: 12.57, seasonDays: 170, springFrostDoy: 112 },
];

/** Invented given names and family names, combined into growers' names (none is a real person's on purpose). */
export const DEMO_ATLAS_GIVEN_NAMES = [
  'Ada', 'Anselm', 'Aurelie', 'Basil', 'Beatrix', 'Cassius', 'Celeste', 'Dario', 'Dorothea', 'Elio', 'Elspeth', 'Ezra',
  'Fenna', 'Florian', 'Gideon', 'Halima', 'Imre', 'Isolde', 'Jasper', 'Juno', 'Kasimir', 'Leocadia', 'Linnea', 'Lucan',
  'Magnus', 'Marisol', 'Nadia', 'Nico', 'Oona', 'Orrin', 'Petra', 'Quentin', 'Rafaela', 'Reuben', 'Saoirse', 'Sebastiano',
  'Sunniva', 'Tarquin', 'Thea', 'Ulla', 'Valentin', 'Vesna', 'Wendeline', 'Xavier', 'Yusuf', 'Zelda', 'Aino', 'Bartholomew',
  'Calla', 'Desmond', 'Eulalia', 'Fintan', 'Giorgia', 'Hamish', 'Ilse', 'Jovan', 'Kaia', 'Lazarus', 'Mehmet', 'Nell',
];
export const DEMO_ATLAS_FAMILY_NAMES = [
  'Ashcombe', 'Belvoir', 'Brackwater', 'Castellane', 'Corriveau', 'Dunmore', 'Elderkin', 'Farrowby', 'Fitzwarren', 'Galloway',
  'Gravesend', 'Hallorann', 'Harrowgate', 'Isenberg', 'Jarrow', 'Kestrel', 'Larkspur', 'Lindgard', 'Marchetti', 'Merriweather',
  'Nightingale', 'Oakhurst', 'Ormsby', 'Pennick', 'Quartermaine', 'Ravensworth', 'Rosenthal', 'Saltonstall', 'Sandoval', 'Thornbury',
  'Underhill', 'Vandermeer', 'Verhoeven', 'Wakefield', 'Whitlock', 'Yardley', 'Zabrowski', 'Abernethy', 'Blackwood', 'Carrasco',
  'Delacroix', 'Esterhazy', 'Fairweather', 'Greenhalgh', 'Holloway', 'Ingleby', 'Kowalczyk', 'Lindenhall', 'Montague', 'Nakashima',
  'Okonkwo', 'Papadakis', 'Quigley', 'Rasmussen', 'Sørlie', 'Tremaine', 'Uriarte', 'Vasquez-Hale', 'Winterbourne', 'Yilmazer',
];

/** How growers say they got a tree through the winter, by growing form. */
export const WINTER_PROTECTION = {
  ground: [
    'Wrapped in burlap with dry leaves packed inside, tarp on top.',
    'Branches tied up, wrapped in frost cloth, a bucket over the top.',
    'Bent the branches down and buried them under soil and straw.',
    'Deep mulch over the roots only; the top takes its chances.',
    'A wire cage filled with leaves from November to April.',
  ],
  wall: ['Fleece over the fan on frosty nights.', 'Straw at the base and a sheet of fleece pinned to the wall.'],
  container: [
    'Moved into the unheated garage after leaf drop.',
    'Wintered in the cellar, watered once a month.',
    'Pot wrapped in bubble wrap, pushed against the house.',
    'Garage from November to March, out again after the last frost.',
  ],
  greenhouse: ['Unheated; fleece on the coldest nights.', 'A small heater keeps it above freezing.'],
} as const;

export const FEEDING = [
  'Compost in spring.',
  'Tomato feed every two weeks in summer.',
  'Balanced slow-release granules in April.',
  'Nothing, it grows fast enough.',
  'Seaweed feed once a month.',
];

export const WATERING = [
  'Deep water once a week in dry spells.',
  'Daily in the hottest weeks (container).',
  'Drip line twice a week.',
  'Rain only.',
  'Every other day in July and August.',
];

/** Short notes a grower adds, by what the season did. */
export const NOTES = {
  ripened: [
    'Best year yet.',
    'Birds found them before I did; netting next year.',
    'Wasps and ants got into the split ones.',
    'Sweet, but a week of rain split half of them.',
    'A dozen figs before the nights turned cold.',
  ],
  unripe: [
    'Plenty of figs, still hard when the frost came.',
    'Figs swelled in September but never softened.',
    'Cool August: nothing turned.',
  ],
  dropped: [
    'Small figs yellowed and fell in July.',
    'Figs dropped at the size of a marble.',
    'Dry spell in June; most of the crop fell.',
  ],
  'no-fruit': ['Grew a lot of leaves, no figs.', 'Died back to the ground in winter; regrew from the roots.', 'Still too young to bear.'],
  breba: ['The breba came through the winter on the wrapped branches.', 'A handful of big early figs in July.'],
} as const;

/** Flags other demo growers raise on a few demo atlas reports (invented). */
export const DEMO_ATLAS_FLAG_REASONS = [
  'Ripe this early so far north? Maybe it was in a greenhouse.',
  'I think this grower posted the same tree twice this season.',
  'Figs from a tree planted that year? The planting year may be wrong.',
  'Pretty sure this is the tree in the community garden, not a private one.',
];

/** Reasons the demo editor gave for the few demo atlas reports that are hidden, and the notes that earned them (invented). */
export const DEMO_ATLAS_HIDDEN = [
  { reason: 'A copy of another report by the same grower for the same tree and season.', notes: null },
  { reason: 'The notes describe a mulberry, not a fig.', notes: 'Long dark berries all over the tree in June, they stain the patio purple.' },
  { reason: 'Advertising in the notes.', notes: 'Rooted cuttings of this tree for sale every spring, message me for prices!' },
] as const;
