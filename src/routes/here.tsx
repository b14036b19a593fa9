import { useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { GROWING_FORMS, type GrowingForm } from '@shared/domain/codes';
import { Page } from '../components/page';
import { useCurrentUser } from '../features/auth/api';
import { HereView } from '../features/guidance/components/here-view';
import { PlacePicker } from '../features/guidance/components/place-picker';
import { savedPlaceQueries } from '../features/places/api';
import { PlaceBar } from '../features/guidance/components/place-bar';
import { useUnits } from '../features/units/use-units';

const num = (v: string | null) => (v !== null && v.trim() !== '' && Number.isFinite(Number(v)) ? Number(v) : null);

export default function HereRoute() {
  const [params, setParams] = useSearchParams();
  const { user } = useCurrentUser();
  const saved = useQuery({ ...savedPlaceQueries.list(), enabled: !!user });
  const lat = num(params.get('lat'));
  const lon = num(params.get('lon'));
  const home = saved.data?.places.find((p) => p.isHome);
  const formParam = params.get('form');
  // A map click brings only lat/lon: then the home place's form, else in the ground.
  const form: GrowingForm = GROWING_FORMS.includes(formParam as GrowingForm) ? (formParam as GrowingForm) : (home?.form ?? 'ground');
  const units = useUnits();
  // A first visit looks within the grower's middle radius choice (100 km, or 60 miles).
  const radiusKm = Math.min(500, Math.max(5, num(params.get('radiusKm')) ?? units.radiusChoices[2]!.km));
  const [pickerOpen, setPickerOpen] = useState(false);
  const point = lat !== null && lon !== null && Math.abs(lat) <= 90 && Math.abs(lon) <= 180 ? { lat, lon } : null;

  useEffect(() => {
    if (!point && home) setParams({ lat: String(home.lat), lon: String(home.lon), form: home.form, radiusKm: String(radiusKm) }, { replace: true });
  }, [point, home, radiusKm, setParams]);

  const update = (next: Record<string, string>) => setParams((prev) => ({ ...Object.fromEntries(prev), ...next }));

  return (
    <Page
      wide
      title="What ripens here"
      intro={
        <span className={point ? 'hidden lg:inline' : ''}>
          Pick a place and how you grow: we gather the growers’ reports and climate stations around it. Fruit that never forms or falls early?{' '}
          <Link to="/why-no-figs" className="font-medium text-fig-600 underline">
            Try the “Why no figs?” check
          </Link>
          .
        </span>
      }
    >
      {/* On a phone the answer comes first: the place and growing form are one line that opens the picker. */}
      {point && <PlaceBar point={point} form={form} radiusKm={radiusKm} open={pickerOpen} onToggle={() => setPickerOpen((o) => !o)} />}
      <div className="grid gap-6 lg:grid-cols-[20rem_1fr]">
        <div id="place-picker" className={`${point && !pickerOpen ? 'hidden' : ''} lg:block`}>
          <PlacePicker
            point={point}
            form={form}
            radiusKm={radiusKm}
            onPoint={(p, f) => {
              setPickerOpen(false);
              update({ lat: p.lat.toFixed(4), lon: p.lon.toFixed(4), ...(f ? { form: f } : {}) });
            }}
            onForm={(f) => update({ form: f })}
            onRadius={(r) => update({ radiusKm: String(r) })}
          />
        </div>
        <div className="min-w-0">
          {point ? (
            <HereView query={{ ...point, form, radiusKm }} />
          ) : (
            <p className="rounded-lg border border-dashed border-fig-200 p-6 text-ink/80">Choose a place to see which varieties ripen there, and how sure we can be.</p>
          )}
        </div>
      </div>
    </Page>
  );
}
