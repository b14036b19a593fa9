import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { GrowingForm } from '@shared/domain/codes';
import { plural } from '@shared/domain/units';
import type { NearResponse, VarietyEvidence } from '@shared/schemas/atlas';
import { usePlaceName } from '../../places/components/place-name';
import { useUnits } from '../../units/use-units';
import { VarietyLink } from '../../varieties/components/variety-link';
import { guidanceQueries } from '../api';
import { PlacePicker, type PickedPoint } from './place-picker';
import { chanceOf, ChanceCell } from './variety-table';

interface Side {
  key: 'a' | 'b';
  point: PickedPoint | null;
}

/** One place's heading and season, with a picker to change it. */
function SideSummary({ side, near, form, radiusKm, onPoint, onForm, onRadius }: {
  side: Side;
  near: NearResponse | undefined;
  form: GrowingForm;
  radiusKm: number;
  onPoint: (p: PickedPoint) => void;
  onForm: (f: GrowingForm) => void;
  onRadius: (r: number) => void;
}) {
  const units = useUnits();
  const place = usePlaceName(side.point);
  const [open, setOpen] = useState(!side.point);
  return (
    <section className="flex flex-col gap-2 rounded-lg border border-fig-100 bg-white p-4" data-testid={`compare-side-${side.key}`}>
      <div className="flex items-start justify-between gap-2">
        <h2 className="text-lg font-semibold text-fig-900">
          <span className="mr-2 rounded bg-fig-100 px-1.5 text-sm text-fig-700">{side.key.toUpperCase()}</span>
          {side.point ? place.label.replace(/^near /, 'Near ').replace(/^at /, 'At ') : 'Choose a place'}
        </h2>
        <button type="button" className="shrink-0 text-sm font-medium text-fig-600 underline" aria-expanded={open} onClick={() => setOpen((o) => !o)}>
          {open ? 'Done' : 'Change'}
        </button>
      </div>
      {near && (
        <p className="text-sm text-ink/80">
          {near.season.days50 === null ? 'No season data in range' : `Typical frost-free season ${Math.round(near.season.days50)} days`}
          {near.season.lastSpringDoy50 !== null ? ` (last frost ${units.dayOfYear(near.season.lastSpringDoy50)})` : ''} · fig wasp {near.wasp.established ? 'established' : 'not recorded'} ·{' '}
          {plural(near.totals.trees, 'tree')} within {units.distance(near.radiusKm)}
        </p>
      )}
      {open && <PlacePicker point={side.point} form={form} radiusKm={radiusKm} onPoint={(p) => { setOpen(false); onPoint(p); }} onForm={onForm} onRadius={onRadius} />}
    </section>
  );
}

/** Two places side by side: their seasons, and every variety reported at either with its chance at each. */
export function ComparePlaces({ a, b, form, radiusKm, onPoint, onForm, onRadius }: {
  a: PickedPoint | null;
  b: PickedPoint | null;
  form: GrowingForm;
  radiusKm: number;
  onPoint: (side: 'a' | 'b', p: PickedPoint) => void;
  onForm: (f: GrowingForm) => void;
  onRadius: (r: number) => void;
}) {
  const nearA = useQuery({ ...guidanceQueries.near({ lat: a?.lat ?? 0, lon: a?.lon ?? 0, form, radiusKm }), enabled: !!a });
  const nearB = useQuery({ ...guidanceQueries.near({ lat: b?.lat ?? 0, lon: b?.lon ?? 0, form, radiusKm }), enabled: !!b });
  const nameA = usePlaceName(a);
  const nameB = usePlaceName(b);
  const byId = new Map<number, { name: string; a?: VarietyEvidence; b?: VarietyEvidence }>();
  for (const v of nearA.data?.varieties ?? []) byId.set(v.varietyId, { name: v.name, a: v });
  for (const v of nearB.data?.varieties ?? []) byId.set(v.varietyId, { ...(byId.get(v.varietyId) ?? { name: v.name }), b: v });
  const score = (v?: VarietyEvidence) => (v ? (chanceOf(v).tooLittle ? -0.5 : (chanceOf(v).value ?? -0.5)) : -1);
  const rows = [...byId.entries()].sort((x, y) => Math.max(score(y[1].a), score(y[1].b)) - Math.max(score(x[1].a), score(x[1].b)) || x[1].name.localeCompare(y[1].name));
  const loading = nearA.isLoading || nearB.isLoading;
  const error = nearA.error ?? nearB.error;
  return (
    <div className="flex flex-col gap-6">
      <div className="grid items-start gap-4 md:grid-cols-2">
        <SideSummary side={{ key: 'a', point: a }} near={nearA.data} form={form} radiusKm={radiusKm} onPoint={(p) => onPoint('a', p)} onForm={onForm} onRadius={onRadius} />
        <SideSummary side={{ key: 'b', point: b }} near={nearB.data} form={form} radiusKm={radiusKm} onPoint={(p) => onPoint('b', p)} onForm={onForm} onRadius={onRadius} />
      </div>
      {error && <p role="alert" className="rounded-lg border border-fig-200 bg-white p-4 text-red-700">The atlas could not answer: {error.message}</p>}
      {loading && <p role="status" className="text-ink/70">Gathering both places…</p>}
      {a && b && nearA.data && nearB.data && (
        <div className="overflow-x-auto rounded-lg border border-fig-100 bg-white">
          <table className="w-full text-left text-sm" data-testid="compare-table">
            <caption className="sr-only">Each variety’s chance at both places</caption>
            <thead className="bg-fig-50 text-ink/70">
              <tr>
                <th scope="col" className="px-3 py-2 font-medium">Variety</th>
                <th scope="col" className="px-3 py-2 font-medium">A: {nameA.town ?? 'first place'}</th>
                <th scope="col" className="px-3 py-2 font-medium">B: {nameB.town ?? 'second place'}</th>
              </tr>
            </thead>
            <tbody>
              {rows.length === 0 && (
                <tr>
                  <td colSpan={3} className="px-3 py-3 text-ink/70">No variety reported near either place.</td>
                </tr>
              )}
              {rows.map(([id, r]) => (
                <tr key={id} className="border-t border-fig-100" data-testid="compare-row">
                  <td className="px-3 py-2">
                    <VarietyLink id={id} name={r.name} />
                  </td>
                  <td className="px-3 py-2">{r.a ? <ChanceCell v={r.a} barClassName="hidden sm:block w-20" /> : <span className="text-ink/70">not reported</span>}</td>
                  <td className="px-3 py-2">{r.b ? <ChanceCell v={r.b} barClassName="hidden sm:block w-20" /> : <span className="text-ink/70">not reported</span>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
