import { Link, useSearchParams } from 'react-router';
import { GROWING_FORMS, type GrowingForm } from '@shared/domain/codes';
import { Page } from '../components/page';
import { ComparePlaces } from '../features/guidance/components/compare-places';
import { useUnits } from '../features/units/use-units';

/** "lat,lon" from the address bar, or null. */
function parsePoint(value: string | null): { lat: number; lon: number } | null {
  if (!value) return null;
  const [lat, lon] = value.split(',').map((v) => (v.trim() === '' ? NaN : Number(v)));
  return lat !== undefined && lon !== undefined && Number.isFinite(lat) && Number.isFinite(lon) && Math.abs(lat) <= 90 && Math.abs(lon) <= 180 ? { lat, lon } : null;
}

export default function HereCompareRoute() {
  const [params, setParams] = useSearchParams();
  const units = useUnits();
  const formParam = params.get('form');
  const form: GrowingForm = GROWING_FORMS.includes(formParam as GrowingForm) ? (formParam as GrowingForm) : 'ground';
  const radiusParam = Number(params.get('radiusKm'));
  const radiusKm = Number.isFinite(radiusParam) && radiusParam > 0 ? Math.min(500, Math.max(5, radiusParam)) : units.radiusChoices[2]!.km;
  const update = (next: Record<string, string>) => setParams((prev) => ({ ...Object.fromEntries(prev), ...next }));
  return (
    <Page
      wide
      title="Compare two places"
      intro={
        <>
          Two places side by side, grown the same way: their seasons and each variety’s chance at both.{' '}
          <Link to="/here" className="font-medium text-fig-600 underline">
            Back to What ripens here
          </Link>
        </>
      }
    >
      <ComparePlaces
        a={parsePoint(params.get('a'))}
        b={parsePoint(params.get('b'))}
        form={form}
        radiusKm={radiusKm}
        onPoint={(side, p) => update({ [side]: `${p.lat.toFixed(4)},${p.lon.toFixed(4)}` })}
        onForm={(f) => update({ form: f })}
        onRadius={(r) => update({ radiusKm: String(r) })}
      />
    </Page>
  );
}
