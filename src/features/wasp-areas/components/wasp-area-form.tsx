import { useState, type FormEvent } from 'react';
import { closeRing, validateWaspGeometry } from '@shared/domain/wasp-geometry';
import { waspAreaInputSchema, type WaspAreaGeometry, type WaspAreaRecord } from '@shared/schemas/wasp-areas';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { Field, FormField, inputClass } from '../../../components/form-field';

export type OutlineMode = 'keep' | 'draw' | 'upload';

export interface WaspAreaFormValues {
  name: string;
  source: string;
  observedOn: string;
  geometry?: WaspAreaGeometry;
}

interface WaspAreaFormProps {
  area: WaspAreaRecord | null;
  mode: OutlineMode;
  onModeChange: (mode: OutlineMode) => void;
  vertices: [number, number][];
  onUndo: () => void;
  onClearDrawing: () => void;
  uploaded: WaspAreaGeometry | null;
  onUploaded: (geometry: WaspAreaGeometry | null) => void;
  onSubmit: (values: WaspAreaFormValues) => Promise<unknown>;
  onCancel: () => void;
  isPending: boolean;
}

/** Record or edit a wasp area: an outline (drawn or uploaded), where the record comes from, and when it was observed. */
export function WaspAreaForm({ area, mode, onModeChange, vertices, onUndo, onClearDrawing, uploaded, onUploaded, onSubmit, onCancel, isPending }: WaspAreaFormProps) {
  const [name, setName] = useState(area?.name ?? '');
  const [source, setSource] = useState(area?.source ?? '');
  const [observedOn, setObservedOn] = useState(area?.observedOn ?? '');
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [fileName, setFileName] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);

  async function onFile(file: File) {
    setFileName(file.name);
    let json: unknown;
    try {
      json = JSON.parse(await file.text());
    } catch {
      onUploaded(null);
      setErrors({ geometry: [`${file.name} is not valid JSON`] });
      return;
    }
    const checked = validateWaspGeometry(json);
    if (!checked.ok) {
      onUploaded(null);
      setErrors({ geometry: checked.problems });
      return;
    }
    setErrors((e) => ({ ...e, geometry: [] }));
    onUploaded(checked.geometry);
  }

  function outline(): WaspAreaGeometry | undefined | 'missing' {
    if (mode === 'keep') return undefined;
    if (mode === 'upload') return uploaded ?? 'missing';
    return vertices.length ? { type: 'Polygon', coordinates: [closeRing(vertices)] } : 'missing';
  }

  async function submit(event: FormEvent) {
    event.preventDefault();
    setFormError(null);
    const geometry = outline();
    const found: Record<string, string[]> = {};
    const parsed = waspAreaInputSchema.safeParse({ name, source, observedOn, geometry: geometry === 'missing' ? undefined : (geometry ?? area?.geometry) });
    if (!parsed.success) for (const issue of parsed.error.issues) (found[String(issue.path[0])] ??= []).push(issue.message);
    if (geometry && geometry !== 'missing') {
      const checked = validateWaspGeometry(geometry);
      if (!checked.ok) found.geometry = checked.problems;
    }
    setErrors(found);
    if (Object.keys(found).length) return;
    try {
      await onSubmit({ name: name.trim(), source: source.trim(), observedOn, ...(geometry && geometry !== 'missing' ? { geometry } : {}) });
    } catch (error) {
      if (!(error instanceof ApiError)) throw error;
      setErrors(error.fields);
      setFormError(error.message);
    }
  }

  const modes: [OutlineMode, string][] = [...(area ? [['keep', 'Keep the current outline'] as [OutlineMode, string]] : []), ['draw', 'Draw on the map'], ['upload', 'Upload a GeoJSON file']];

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4" aria-label={area ? 'Edit wasp area' : 'New wasp area'}>
      <FormField label="Area name" hint="A place name people recognise, e.g. a valley or county." value={name} onChange={(e) => setName(e.target.value)} error={errors.name?.[0]} />
      <Field label="Source" hint="Where the record comes from: a survey, an extension note, a publication (with its date or page)." error={errors.source?.[0]}>
        {(p) => <textarea {...p} rows={2} className={inputClass} value={source} onChange={(e) => setSource(e.target.value)} />}
      </Field>
      <FormField label="Date observed" type="date" hint="When the wasp was seen established there." value={observedOn} onChange={(e) => setObservedOn(e.target.value)} error={errors.observedOn?.[0]} />
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-medium">Outline</legend>
        <div className="flex flex-wrap gap-2">
          {modes.map(([value, label]) => (
            <label key={value} className="flex cursor-pointer items-center gap-2 rounded-md border border-fig-200 bg-white px-3 py-1.5 text-sm has-[:checked]:border-fig-600 has-[:checked]:bg-fig-50">
              <input type="radio" name="outline" checked={mode === value} onChange={() => onModeChange(value)} />
              {label}
            </label>
          ))}
        </div>
        {mode === 'draw' && (
          <div className="flex flex-wrap items-center gap-2 text-sm">
            <span className="text-ink/75">{vertices.length} corner{vertices.length === 1 ? '' : 's'} placed</span>
            <Button type="button" variant="quiet" onClick={onUndo} disabled={!vertices.length}>
              Undo last corner
            </Button>
            <Button type="button" variant="quiet" onClick={onClearDrawing} disabled={!vertices.length}>
              Start over
            </Button>
          </div>
        )}
        {mode === 'upload' && (
          <label className="flex flex-col gap-1 text-sm">
            <span className="font-medium">GeoJSON file</span>
            <input type="file" accept=".geojson,.json,application/geo+json,application/json" onChange={(e) => e.target.files?.[0] && void onFile(e.target.files[0])} />
            <span className="text-xs text-ink/70">A Feature, a FeatureCollection with one area, or a bare Polygon or MultiPolygon, in longitude/latitude (WGS 84).</span>
            {fileName && uploaded && <span className="text-xs text-leaf-700">{fileName}: outline read, shown on the map.</span>}
          </label>
        )}
        {(errors.geometry?.length ?? 0) > 0 && (
          <ul role="alert" className="list-disc pl-5 text-sm text-red-700">
            {errors.geometry!.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        )}
      </fieldset>
      {formError && !errors.geometry?.length && (
        <p role="alert" className="text-sm text-red-700">
          {formError}
        </p>
      )}
      <div className="flex gap-2">
        <Button type="submit" disabled={isPending}>
          {isPending ? 'Saving…' : area ? 'Save changes' : 'Record area'}
        </Button>
        <Button type="button" variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
