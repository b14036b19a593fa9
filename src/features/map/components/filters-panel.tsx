import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { CROPS, FIG_TYPES, GROWING_FORMS, LABELS, OUTCOMES } from '@shared/domain/codes';
import type { PinFilters } from '@shared/schemas/pins';
import { Field } from '../../../components/form-field';
import { exportUrl } from '../../reports/api';
import { mapQueries } from '../api';
import type { OverlayName } from '../url-state';
import { useUnits } from '../../units/use-units';
import { DATA_LICENCE } from '@shared/domain/data-licence';
import { Link } from 'react-router';

const FIRST_SEASON = 2015;
const seasons = Array.from({ length: new Date().getFullYear() - FIRST_SEASON + 1 }, (_, i) => new Date().getFullYear() - i);

const selectClass = 'w-full rounded-md border border-fig-200 bg-white px-2.5 py-1.5 text-sm shadow-sm focus:border-fig-500 focus:outline-none';

interface FiltersPanelProps {
  filters: PinFilters;
  overlays: OverlayName[];
  totalReports: number | null;
  onFiltersChange: (filters: PinFilters) => void;
  onOverlaysChange: (overlays: OverlayName[]) => void;
}

/** The atlas's filters and layer switches; every change lands in the URL, so the view can be shared. */
export function FiltersPanel({ filters, overlays, totalReports, onFiltersChange, onOverlaysChange }: FiltersPanelProps) {
  const units = useUnits();
  const varieties = useQuery(mapQueries.varieties());
  const [copied, setCopied] = useState(false);
  const set = <K extends keyof PinFilters>(key: K, value: PinFilters[K] | undefined) => onFiltersChange({ ...filters, [key]: value });
  const text = (value: string) => (value === '' ? undefined : value);
  const toggle = (name: OverlayName, on: boolean) => onOverlaysChange(on ? [...overlays, name] : overlays.filter((o) => o !== name));
  const active = Object.values(filters).filter((v) => v !== undefined).length;

  const copyLink = async () => {
    try {
      await navigator.clipboard.writeText(window.location.href);
      setCopied(true);
      setTimeout(() => setCopied(false), 2500);
    } catch {
      window.prompt('Copy this link to share the view:', window.location.href);
    }
  };

  return (
    <div className="flex flex-col gap-4">
      <p className="text-sm text-ink/80" aria-live="polite">
        {totalReports === null ? 'Loading reports…' : totalReports === 1 ? 'One published report matches.' : `${totalReports.toLocaleString()} published reports match.`}
      </p>

      <fieldset className="flex flex-col gap-3">
        <legend className="mb-1 text-xs font-semibold tracking-wide text-fig-700 uppercase">Which reports</legend>
        <Field label="Variety" hint="Names marked “fictional” belong to the demo.">
          {(control) => (
            <select {...control} className={selectClass} value={filters.varietyId ?? ''} onChange={(e) => set('varietyId', e.target.value ? Number(e.target.value) : undefined)}>
              <option value="">All varieties</option>
              {varieties.data?.varieties.map((v) => (
                <option key={v.id} value={v.id}>
                  {v.name}
                  {v.isFictional ? ' (fictional)' : ''}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Fig type" hint="Smyrna and San Pedro main crops need the fig wasp.">
          {(control) => (
            <select {...control} className={selectClass} value={filters.figType ?? ''} onChange={(e) => set('figType', text(e.target.value) as PinFilters['figType'])}>
              <option value="">All types</option>
              {FIG_TYPES.map((t) => (
                <option key={t} value={t}>
                  {LABELS.figType[t]}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Crop">
          {(control) => (
            <select {...control} className={selectClass} value={filters.crop ?? ''} onChange={(e) => set('crop', text(e.target.value) as PinFilters['crop'])}>
              <option value="">Breba and main crop</option>
              {CROPS.map((c) => (
                <option key={c} value={c}>
                  {LABELS.crop[c]}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Outcome">
          {(control) => (
            <select {...control} className={selectClass} value={filters.outcome ?? ''} onChange={(e) => set('outcome', text(e.target.value) as PinFilters['outcome'])}>
              <option value="">Every outcome</option>
              {OUTCOMES.map((o) => (
                <option key={o} value={o}>
                  {LABELS.outcome[o]}
                </option>
              ))}
            </select>
          )}
        </Field>
        <div className="grid grid-cols-2 gap-2">
          <Field label="Seasons from">
            {(control) => (
              <select {...control} className={selectClass} value={filters.seasonFrom ?? ''} onChange={(e) => set('seasonFrom', e.target.value ? Number(e.target.value) : undefined)}>
                <option value="">Any</option>
                {seasons.filter((y) => filters.seasonTo === undefined || y <= filters.seasonTo).map((y) => (
                  <option key={y} value={y}>
                    {y}
                  </option>
                ))}
              </select>
            )}
          </Field>
          <Field label="to">
            {(control) => (
              <select {...control} className={selectClass} value={filters.seasonTo ?? ''} onChange={(e) => set('seasonTo', e.target.value ? Number(e.target.value) : undefined)}>
                <option value="">Any</option>
                {seasons.filter((y) => filters.seasonFrom === undefined || y >= filters.seasonFrom).map((y) => (
                  <option key={y} value={y}>
                    {y}
                  </option>
                ))}
              </select>
            )}
          </Field>
        </div>
        <Field label="Growing form" hint="Containers and warm walls give a head start in short seasons.">
          {(control) => (
            <select {...control} className={selectClass} value={filters.form ?? ''} onChange={(e) => set('form', text(e.target.value) as PinFilters['form'])}>
              <option value="">Any way of growing</option>
              {GROWING_FORMS.map((f) => (
                <option key={f} value={f}>
                  {LABELS.growingForm[f]}
                </option>
              ))}
            </select>
          )}
        </Field>
        {active > 0 && (
          <button type="button" className="self-start text-sm font-medium text-fig-600 underline underline-offset-2 hover:text-fig-700" onClick={() => onFiltersChange({})}>
            Clear {active === 1 ? 'the filter' : `all ${active} filters`}
          </button>
        )}
      </fieldset>

      <fieldset className="flex flex-col gap-2 border-t border-fig-100 pt-4">
        <legend className="mb-1 text-xs font-semibold tracking-wide text-fig-700 uppercase">Map layers</legend>
        <label className="flex items-start gap-2 text-sm">
          <input type="checkbox" className="mt-0.5 h-4 w-4 accent-leaf-700" checked={overlays.includes('wasp')} onChange={(e) => toggle('wasp', e.target.checked)} />
          <span>
            Fig wasp established
            <span className="block text-xs text-ink/70">Areas where editors recorded the pollinating wasp.</span>
          </span>
        </label>
        <label className="flex items-start gap-2 text-sm">
          <input type="checkbox" className="mt-0.5 h-4 w-4 accent-fig-600" checked={overlays.includes('frost')} onChange={(e) => toggle('frost', e.target.checked)} />
          <span>
            Frost-free season
            <span className="block text-xs text-ink/70">Days between frosts ({units.temperature(32)}) in half the years, shaded from nearby stations and growers’ frost dates; faded where they are few or far.</span>
          </span>
        </label>
      </fieldset>

      <div className="border-t border-fig-100 pt-4">
        <button type="button" onClick={copyLink} className="rounded-md border border-fig-200 bg-white px-3 py-1.5 text-sm font-medium text-fig-700 hover:bg-fig-50">
          {copied ? 'Link copied' : 'Copy a link to this view'}
        </button>
        <p className="mt-1 text-xs text-ink/70">The link keeps the filters, layers and where the map is.</p>
        <p className="mt-3 text-sm">
          Download these reports:{' '}
          <a className="font-medium text-fig-700 underline" href={exportUrl('csv', filters)} download>
            CSV
          </a>{' '}
          ·{' '}
          <a className="font-medium text-fig-700 underline" href={exportUrl('geojson', filters)} download>
            GeoJSON
          </a>
        </p>
        <p className="mt-1 text-xs text-ink/70">Every published report the filters match, anywhere on the map, each at its ~5 km grid cell: never a garden’s own place.</p>
        <p className="mt-1 text-xs text-ink/70" data-testid="export-licence">
          Open data under{' '}
          <a className="underline" href={DATA_LICENCE.url} rel="license">
            {DATA_LICENCE.name}
          </a>
          : credit “{DATA_LICENCE.attribution}”.{' '}
          <Link to="/about" className="underline">
            About the data
          </Link>
        </p>
      </div>
    </div>
  );
}
