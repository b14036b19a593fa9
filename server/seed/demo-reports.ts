import type { Crop, GrowingForm, Outcome, PlantOrigin } from '../../shared/domain/codes';
import { toPublicPoint } from '../../shared/domain/public-grid';
import { DEMO_SEASONS, DEMO_TOWNS, storyHeatChance, type DemoTown, type DemoVariety } from './demo-scenario';
import { pick, seededRandom } from './random';

export interface DemoReport {
  growerIndex: number;
  treeKey: string;
  varietyName: string;
  lat: number;
  lon: number;
  gridLat: number;
  gridLon: number;
  form: GrowingForm;
  origin: PlantOrigin;
  yearPlanted: number;
  season: number;
  crop: Crop;
  outcome: Outcome;
  firstRipeDate: string | null;
  lastHarvestDate: string | null;
  springFrostDate: string | null;
  fallFrostDate: string | null;
  pinched: boolean;
  pinchedDate: string | null;
  notes: string;
}

const FORM_HEAD_START: Record<GrowingForm, number> = { ground: 0, container: 20, wall: 15, greenhouse: 45 };

function isoDate(year: number, dayOfYear: number): string {
  const date = new Date(Date.UTC(year, 0, 1));
  date.setUTCDate(dayOfYear);
  return date.toISOString().slice(0, 10);
}

/**
 * The demo story: each invented grower lives near one town and keeps one to four trees; each tree
 * gets a report per season (and per crop where the variety bears a breba). The outcome follows the
 * story's own rules: young seedlings bear nothing, pollination-dependent crops drop where the wasp
 * is absent, and a crop ripens when the season (plus a container's head start) covers its days
 * and, where the town has a heat figure, the summer gives the variety its heat.
 */
export function buildDemoReports(growerCount: number, varieties: DemoVariety[], seed = 20261202, towns: DemoTown[] = DEMO_TOWNS): DemoReport[] {
  const random = seededRandom(seed);
  const eatingVarieties = varieties.filter((v) => v.figType !== 'caprifig');
  const reports: DemoReport[] = [];

  for (let grower = 0; grower < growerCount; grower++) {
    const town: DemoTown = towns[grower % towns.length]!;
    // A private spot within about 25 km of the town centre.
    const lat = town.lat + (random() - 0.5) * 0.45;
    const lon = town.lon + (random() - 0.5) * 0.6;
    const treeCount = 1 + Math.floor(random() * 4);

    for (let tree = 0; tree < treeCount; tree++) {
      const variety = pick(random, eatingVarieties);
      const form: GrowingForm = pick(random, ['ground', 'ground', 'container', 'container', 'wall', 'greenhouse'] as const);
      const origin: PlantOrigin = pick(random, ['cutting', 'cutting', 'cutting', 'air-layer', 'graft', 'tissue-culture', 'seedling'] as const);
      const yearPlanted = 2018 + Math.floor(random() * 5);
      const firstSeason = Math.max(yearPlanted + 1, DEMO_SEASONS[0]);
      const crops: Crop[] = variety.bearsBreba ? ['breba', 'main'] : ['main'];

      for (const season of DEMO_SEASONS) {
        if (season < firstSeason) continue;
        const springDoy = town.springFrostDoy + Math.round((random() - 0.5) * 20);
        const seasonDays = town.seasonDays + Math.round((random() - 0.5) * 24);
        const pinched = random() < 0.35;
        for (const crop of crops) {
          const outcome = storyOutcome({ random, town, variety, form, origin, age: season - yearPlanted, crop, seasonDays, pinched });
          const need = (variety.typicalDaysToRipen ?? 170) - (crop === 'breba' ? 60 : 0);
          const ripeDoy = springDoy + Math.max(40, need - FORM_HEAD_START[form] + Math.round((random() - 0.5) * 16));
          const point = toPublicPoint(lat, lon);
          reports.push({
            growerIndex: grower,
            treeKey: `${grower}:${tree}`,
            varietyName: variety.name,
            lat: round5(lat),
            lon: round5(lon),
            gridLat: point.lat,
            gridLon: point.lon,
            form,
            origin,
            yearPlanted,
            season,
            crop,
            outcome,
            firstRipeDate: outcome === 'ripened' ? isoDate(season, ripeDoy) : null,
            lastHarvestDate: outcome === 'ripened' ? isoDate(season, Math.min(springDoy + seasonDays, ripeDoy + 30)) : null,
            springFrostDate: random() < 0.6 ? isoDate(season, springDoy) : null,
            fallFrostDate: random() < 0.6 ? isoDate(season, springDoy + seasonDays) : null,
            pinched,
            pinchedDate: pinched ? isoDate(season, 165 + Math.floor(random() * 20)) : null,
            notes: outcome === 'unripe' ? 'Plenty of figs, still hard when the frost came.' : '',
          });
        }
      }
    }
  }
  return reports;
}

function storyOutcome(input: {
  random: () => number;
  town: DemoTown;
  variety: DemoVariety;
  form: GrowingForm;
  origin: PlantOrigin;
  age: number;
  crop: Crop;
  seasonDays: number;
  pinched: boolean;
}): Outcome {
  const { random, town, variety, form, origin, age, crop, seasonDays, pinched } = input;
  const juvenile = (origin === 'seedling' && age < 5) || (origin === 'tissue-culture' && age < 3);
  if (juvenile || (age < 2 && random() < 0.5)) return 'no-fruit';
  const needsWasp = variety.figType === 'smyrna' || (variety.figType === 'san-pedro' && crop === 'main');
  if (needsWasp && !town.waspEstablished) return 'dropped';
  if (random() < 0.06) return 'dropped'; // a dry July, or roots sitting in water
  if (crop === 'breba') return random() < 0.85 ? 'ripened' : 'dropped';
  const need = variety.typicalDaysToRipen ?? 170;
  const available = seasonDays + FORM_HEAD_START[form] + (pinched ? 8 : 0) + Math.round((random() - 0.5) * 20);
  const onDays = available >= need + 10 ? 'ripened' : available >= need - 10 && random() < 0.5 ? 'ripened' : 'unripe';
  if (onDays === 'unripe' || town.heatF === undefined) return onDays;
  return random() < storyHeatChance(town, variety, form, random() - 0.5) ? 'ripened' : 'unripe';
}

/** A coordinate to 5 decimals (about a metre), as the demo stores places. */
export const round5 = (value: number) => Math.round(value * 1e5) / 1e5;
