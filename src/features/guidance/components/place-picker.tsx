import { useQuery } from '@tanstack/react-query';
import { useEffect, useId, useState } from 'react';
import { GROWING_FORMS, LABELS, type GrowingForm } from '@shared/domain/codes';
import { Button } from '../../../components/button';
import { useCurrentUser } from '../../auth/api';
import { savedPlaceQueries } from '../../places/api';
import { PlaceSearch } from '../../places/components/place-search';
import { useUnits } from '../../units/use-units';

/** The grower's round radius choices, plus the current one when it is not among them (a link, or the other unit). */
export function radiusOptions(choices: { km: number; label: string }[], currentKm: number, format: (km: number) => string) {
  const list = choices.some((c) => Math.abs(c.km - currentKm) < 0.01) ? choices : [...choices, { km: currentKm, label: format(currentKm) }];
  return list.sort((a, b) => a.km - b.km);
}

export interface PickedPoint {
  lat: number;
  lon: number;
}

const selectClass = 'rounded-md border border-fig-200 bg-white px-3 py-2 text-base shadow-sm focus:border-fig-500 focus:outline-none';

/** Choose where: a town search, the grower's saved places, or coordinates; and the form and radius. */
export function PlacePicker({
  point,
  form,
  radiusKm,
  onPoint,
  onForm,
  onRadius,
}: {
  point: PickedPoint | null;
  form: GrowingForm;
  radiusKm: number;
  onPoint: (p: PickedPoint, form?: GrowingForm) => void;
  onForm: (f: GrowingForm) => void;
  onRadius: (r: number) => void;
}) {
  const id = useId();
  const { user } = useCurrentUser();
  const units = useUnits();
  const saved = useQuery({ ...savedPlaceQueries.list(), enabled: !!user });
  const [lat, setLat] = useState(point ? String(point.lat) : '');
  const [lon, setLon] = useState(point ? String(point.lon) : '');
  useEffect(() => {
    if (point) {
      setLat(String(point.lat));
      setLon(String(point.lon));
    }
  }, [point?.lat, point?.lon]); // eslint-disable-line react-hooks/exhaustive-deps

  const latN = Number(lat);
  const lonN = Number(lon);
  const coordsOk = lat.trim() !== '' && lon.trim() !== '' && Math.abs(latN) <= 90 && Math.abs(lonN) <= 180;

  return (
    <div className="flex flex-col gap-4 self-start rounded-lg border border-fig-100 bg-white p-4">
      <PlaceSearch
        near={point ?? undefined}
        hint="Type two letters or more. Or click a spot on the atlas map, or use one of your saved places."
        onPick={(p) => onPoint({ lat: p.lat, lon: p.lon })}
      />

      {saved.data && saved.data.places.length > 0 && (
        <div>
          <p className="text-sm font-medium">Your places</p>
          <div className="mt-1 flex flex-wrap gap-2">
            {saved.data.places.map((p) => (
              <Button key={p.id} type="button" variant="secondary" className="!px-3 !py-1" onClick={() => onPoint({ lat: p.lat, lon: p.lon }, p.form)}>
                {p.isHome ? '⌂ ' : ''}
                {p.name}
              </Button>
            ))}
          </div>
        </div>
      )}

      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          if (coordsOk) onPoint({ lat: latN, lon: lonN });
        }}
      >
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-lat`} className="text-sm font-medium">
            Latitude
          </label>
          <input id={`${id}-lat`} inputMode="decimal" value={lat} onChange={(e) => setLat(e.target.value)} className="w-28 rounded-md border border-fig-200 px-2 py-2" />
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-lon`} className="text-sm font-medium">
            Longitude
          </label>
          <input id={`${id}-lon`} inputMode="decimal" value={lon} onChange={(e) => setLon(e.target.value)} className="w-28 rounded-md border border-fig-200 px-2 py-2" />
        </div>
        <Button type="submit" variant="secondary" disabled={!coordsOk}>
          Use these coordinates
        </Button>
      </form>

      <div className="flex flex-wrap gap-4">
        <div className="flex min-w-[12rem] flex-1 flex-col gap-1">
          <label htmlFor={`${id}-form`} className="text-sm font-medium">
            How you grow it
          </label>
          <select id={`${id}-form`} value={form} onChange={(e) => onForm(e.target.value as GrowingForm)} className={selectClass}>
            {GROWING_FORMS.map((f) => (
              <option key={f} value={f}>
                {LABELS.growingForm[f]}
              </option>
            ))}
          </select>
          <p className="text-xs text-ink/70">Containers and warm walls get a head start on the season.</p>
        </div>
        <div className="flex min-w-[12rem] flex-1 flex-col gap-1">
          <label htmlFor={`${id}-radius`} className="text-sm font-medium">
            Look within
          </label>
          <select id={`${id}-radius`} value={radiusKm} onChange={(e) => onRadius(Number(e.target.value))} className={selectClass}>
            {radiusOptions(units.radiusChoices, radiusKm, units.distance).map((r) => (
              <option key={r.km} value={r.km}>
                {r.label}
              </option>
            ))}
          </select>
          <p className="text-xs text-ink/70">Wider finds more reports, but from less similar places.</p>
        </div>
      </div>
    </div>
  );
}
