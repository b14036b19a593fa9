import { useQuery } from '@tanstack/react-query';
import { useEffect } from 'react';
import { Link, useSearchParams } from 'react-router';
import { GROWING_FORMS, type GrowingForm } from '@shared/domain/codes';
import { Page } from '../components/page';
import { useCurrentUser } from '../features/auth/api';
import { HereView } from '../features/guidance/components/here-view';
import { PlacePicker } from '../features/guidance/components/place-picker';
import { savedPlaceQueries } from '../features/places/api';

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
  const radiusKm = Math.min(500, Math.max(5, num(params.get('radiusKm')) ?? 100));
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
        <>
          Pick a place and how you grow: we gather the growers’ reports and climate stations around it. Fruit that never forms or falls early?{' '}
          <Link to="/why-no-figs" className="font-medium text-fig-600 underline">
            Try the “Why no figs?” check
          </Link>
          .
        </>
      }
    >
      <div className="grid gap-6 lg:grid-cols-[20rem_1fr]">
        <PlacePicker
          point={point}
          form={form}
          radiusKm={radiusKm}
          onPoint={(p, f) => update({ lat: p.lat.toFixed(4), lon: p.lon.toFixed(4), ...(f ? { form: f } : {}) })}
          onForm={(f) => update({ form: f })}
          onRadius={(r) => update({ radiusKm: String(r) })}
        />
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
