import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { lazy, Suspense, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { CROPS, GROWING_FORMS, LABELS, OUTCOMES, PLANT_ORIGINS } from '@shared/domain/codes';
import { NOTES_MAX, PHOTOS_PER_REPORT, createReportInputSchema, type CreateReportInput, type CreateReportValues, type Report } from '@shared/schemas/reports';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { reportQueries, useDeletePhoto, useUpdateReport, useUploadPhotos } from '../api';
import { useCurrentUser } from '../../auth/api';
import { submitNewReport } from '../../report-outbox/send';
import { ChoiceGroup, FormSection, choiceClass } from './fields';
import { Field, FormField, inputClass, useFocusFirstInvalid } from '../../../components/form-field';
import { PhotoPicker, checkPhotoFiles } from './photo-picker';
import { WherePicker } from './where-picker';
import { useHomePlace } from '../../places/api';
import { VarietyPicker } from './variety-picker';
import { countOf } from '@shared/domain/plural';

const MiniMap = lazy(() => import('./mini-map'));

const toNumber = (value: unknown) => (value === '' || value === null || value === undefined ? null : Number(value));

const OUTCOME_HINTS: Record<(typeof OUTCOMES)[number], string> = {
  'no-fruit': 'No figs formed on this crop at all.',
  dropped: 'Figs formed but fell off small or yellowed: often missing pollination, drought or stress.',
  unripe: 'Figs were still hard and green when the first frost came.',
  ripened: 'At least some figs softened, drooped and tasted ripe.',
};

function emptyValues(): CreateReportInput {
  const now = new Date();
  // Before July most growers report on last year's season.
  const season = now.getMonth() < 6 ? now.getFullYear() - 1 : now.getFullYear();
  return {
    varietyId: null,
    proposedVarietyName: null,
    treeId: null,
    newTreeLabel: '',
    lat: undefined as unknown as number,
    lon: undefined as unknown as number,
    form: 'ground',
    origin: 'unknown',
    yearPlanted: null,
    season,
    crop: 'main',
    outcome: undefined as unknown as CreateReportInput['outcome'],
    firstRipeDate: '',
    lastHarvestDate: '',
    springFrostDate: '',
    fallFrostDate: '',
    pinched: false,
    pinchedDate: '',
    winterProtection: '',
    feeding: '',
    watering: '',
    notes: '',
  };
}

function valuesOf(report: Report): CreateReportInput {
  return {
    varietyId: report.variety?.id ?? null,
    proposedVarietyName: report.variety ? null : report.proposedVarietyName,
    treeId: report.treeId,
    newTreeLabel: '',
    lat: report.lat ?? report.gridLat,
    lon: report.lon ?? report.gridLon,
    form: report.form,
    origin: report.origin,
    yearPlanted: report.yearPlanted,
    season: report.season,
    crop: report.crop,
    outcome: report.outcome,
    firstRipeDate: report.firstRipeDate ?? '',
    lastHarvestDate: report.lastHarvestDate ?? '',
    springFrostDate: report.springFrostDate ?? '',
    fallFrostDate: report.fallFrostDate ?? '',
    pinched: report.pinched,
    pinchedDate: report.pinchedDate ?? '',
    winterProtection: report.winterProtection,
    feeding: report.feeding,
    watering: report.watering,
    notes: report.notes,
  };
}

export interface SavedResult {
  id: number;
  /** A new report (posted) or a change to one (saved). */
  action: 'posted' | 'saved';
  status?: Report['status'];
  notice?: string;
  photoError?: string;
}

/** Post a new harvest report, or edit one: validated with the same schema the server uses. */
export function ReportForm({ report, onSaved, onKept }: { report?: Report; onSaved: (result: SavedResult) => void; /** A new report kept on the phone (no connection). */ onKept?: () => void }) {
  const editing = !!report;
  const form = useForm<CreateReportInput, unknown, CreateReportValues>({
    resolver: zodResolver(createReportInputSchema),
    defaultValues: report ? valuesOf(report) : emptyValues(),
    // The variety picker is not a registered field: focus goes to the first problem on the page instead.
    shouldFocusError: false,
  });
  const { register, setValue, watch, formState } = form;
  const { errors } = formState;
  const formRef = useRef<HTMLFormElement>(null);
  const errorCount = Object.keys(errors).length;
  useFocusFirstInvalid(formRef, { submitCount: formState.submitCount, isSubmitting: formState.isSubmitting, hasErrors: errorCount > 0 });
  const trees = useQuery(reportQueries.trees());
  const queryClient = useQueryClient();
  const { user } = useCurrentUser();
  const home = useHomePlace();
  const update = useUpdateReport();
  const upload = useUploadPhotos();
  const deletePhoto = useDeletePhoto();
  const [varietyName, setVarietyName] = useState<string | null>(report?.variety?.name ?? null);
  const [files, setFiles] = useState<File[]>([]);
  const [photoError, setPhotoError] = useState<string | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const [mapKey, setMapKey] = useState(0);

  const varietyId = watch('varietyId') ?? null;
  const proposedName = watch('proposedVarietyName') ?? null;
  const treeId = watch('treeId') ?? null;
  const pinched = watch('pinched');
  const lat = watch('lat');
  const lon = watch('lon');
  const existingPhotos = report?.photos ?? [];

  const chooseTree = (value: string) => {
    const id = toNumber(value);
    setValue('treeId', id, { shouldDirty: true });
    const tree = trees.data?.trees.find((t) => t.id === id);
    if (!tree || editing) return;
    // A tree's earlier report fills what rarely changes between seasons.
    if (tree.lastVarietyId) {
      setValue('varietyId', tree.lastVarietyId);
      setValue('proposedVarietyName', null);
      setVarietyName(tree.lastVarietyName);
    }
    if (tree.lastLat !== null && tree.lastLon !== null) {
      setValue('lat', tree.lastLat);
      setValue('lon', tree.lastLon);
    }
    if (tree.lastForm) setValue('form', tree.lastForm);
    if (tree.lastOrigin) setValue('origin', tree.lastOrigin);
    if (tree.lastYearPlanted) setValue('yearPlanted', tree.lastYearPlanted);
  };

  const showRefusal = (error: unknown) => {
    if (error instanceof ApiError && Object.keys(error.fields).length) {
      for (const [field, messages] of Object.entries(error.fields)) form.setError(field as keyof CreateReportInput, { message: messages[0] });
      setFormError(error.message);
    } else {
      setFormError(error instanceof Error ? error.message : 'The report could not be saved');
    }
  };

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    const fileProblem = checkPhotoFiles(files, PHOTOS_PER_REPORT - existingPhotos.length);
    if (fileProblem) return setPhotoError(fileProblem);
    if (!report) {
      // A new report goes through the phone's outbox: kept first, sent now or when the signal returns.
      try {
        const outcome = await submitNewReport(user!.id, values, files, setProgress);
        if (outcome.kind === 'refused') return showRefusal(outcome.error);
        if (outcome.kind === 'kept') return onKept?.();
        await queryClient.invalidateQueries({ queryKey: reportQueries.all });
        return onSaved({ id: outcome.id, notice: outcome.notice, photoError: outcome.photoError, action: 'posted' });
      } catch (error) {
        return showRefusal(error);
      } finally {
        setProgress(null);
      }
    }
    let saved: Omit<SavedResult, 'photoError'>;
    try {
      const result = await update.mutateAsync({ id: report.id, ...values });
      saved = { id: result.report.id, notice: result.notice, action: 'saved', status: result.report.status };
    } catch (error) {
      showRefusal(error);
      return;
    }
    let uploadProblem: string | undefined;
    if (files.length) {
      setProgress(0);
      try {
        await upload.mutateAsync({ id: saved.id, files, onProgress: setProgress });
      } catch (error) {
        uploadProblem = `The report was saved, but the photos were not: ${error instanceof ApiError ? (Object.values(error.fields)[0]?.[0] ?? error.message) : 'the upload failed'}`;
      } finally {
        setProgress(null);
      }
    }
    onSaved({ ...saved, photoError: uploadProblem });
  });

  const busy = formState.isSubmitting || update.isPending || upload.isPending;

  return (
    <form ref={formRef} noValidate className="flex flex-col gap-6" onSubmit={onSubmit} aria-label={editing ? 'Edit report' : 'New report'}>
      <FormSection title="Which tree" intro="One report covers one tree (or one planting) for one season and one crop. Reports of the same tree over the years count as one tree in the atlas.">
        <Field label="Tree" hint={editing ? 'Move this report to another of your trees, or to a new one.' : 'Pick a tree you reported before to fill in what stays the same, or start a new one.'} error={errors.treeId?.message}>
          {(props) => (
            <select {...props} className={inputClass} value={treeId === null ? '' : String(treeId)} onChange={(e) => chooseTree(e.target.value)}>
              <option value="">A new tree</option>
              {trees.data?.trees.map((tree) => (
                <option key={tree.id} value={tree.id}>
                  {tree.label} ({countOf(tree.reportCount, 'report')})
                </option>
              ))}
            </select>
          )}
        </Field>
        {treeId === null && (
          <FormField
            label="Label for the new tree"
            hint="Only you see it, e.g. “By the south wall” or “Big pot”. Leave empty to use the variety’s name."
            error={errors.newTreeLabel?.message}
            {...register('newTreeLabel')}
          />
        )}
        <VarietyPicker
          varietyId={varietyId}
          varietyName={varietyName}
          proposedName={proposedName}
          error={errors.varietyId?.message}
          proposeError={errors.proposedVarietyName?.message}
          onChoose={(variety) => {
            setValue('varietyId', variety?.id ?? null, { shouldValidate: formState.isSubmitted });
            setValue('proposedVarietyName', null);
            setVarietyName(variety?.name ?? null);
          }}
          onPropose={(name) => {
            setValue('varietyId', null);
            setValue('proposedVarietyName', name, { shouldValidate: formState.isSubmitted });
          }}
        />
      </FormSection>

      <FormSection title="Where it grows" intro="Your exact spot stays private: only you and the editors see it. Everyone else sees the report on a grid of about 5 km.">
        <WherePicker
          onPlace={(place) => {
            setValue('lat', Math.round(place.lat * 1e5) / 1e5, { shouldValidate: true });
            setValue('lon', Math.round(place.lon * 1e5) / 1e5, { shouldValidate: true });
            if (place.form && !editing) setValue('form', place.form);
            setMapKey((k) => k + 1);
          }}
        />
        <div className="flex flex-col gap-1">
          <Suspense fallback={<div className="h-64 rounded-lg bg-leaf-100/50" />}>
            <MiniMap
              key={`${mapKey}-${home?.id ?? 0}`}
              className="h-64"
              label="Click where the tree stands"
              lat={typeof lat === 'number' && Number.isFinite(lat) ? lat : null}
              lon={typeof lon === 'number' && Number.isFinite(lon) ? lon : null}
              zoom={11}
              startAt={home}
              onPick={(point) => {
                setValue('lat', point.lat, { shouldValidate: formState.isSubmitted });
                setValue('lon', point.lon, { shouldValidate: formState.isSubmitted });
              }}
            />
          </Suspense>
          <p className="text-xs text-ink/70">Click the map where the tree stands (zoom in with + for precision), or type the coordinates.</p>
        </div>
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Latitude" type="number" step="any" inputMode="decimal" hint="Decimal degrees, north positive (e.g. 42.6526)." error={errors.lat?.message} {...register('lat', { setValueAs: toNumber })} />
          <FormField label="Longitude" type="number" step="any" inputMode="decimal" hint="Decimal degrees, west negative (e.g. -73.7562)." error={errors.lon?.message} {...register('lon', { setValueAs: toNumber })} />
        </div>
        <ChoiceGroup legend="Growing form" hint="A container or a warm wall gives a head start over open ground; a greenhouse more." error={errors.form?.message}>
          {GROWING_FORMS.map((code) => (
            <label key={code} className={choiceClass}>
              <input type="radio" value={code} className="accent-fig-600" {...register('form')} />
              {LABELS.growingForm[code]}
            </label>
          ))}
        </ChoiceGroup>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Plant origin" hint="Seedlings and tissue-culture plants can take years before they fruit." error={errors.origin?.message}>
            {(props) => (
              <select {...props} className={inputClass} {...register('origin')}>
                {PLANT_ORIGINS.map((code) => (
                  <option key={code} value={code}>
                    {LABELS.plantOrigin[code]}
                  </option>
                ))}
              </select>
            )}
          </Field>
          <FormField label="Year planted" type="number" inputMode="numeric" hint="When it went where it grows now; leave empty if unsure." error={errors.yearPlanted?.message} {...register('yearPlanted', { setValueAs: toNumber })} />
        </div>
      </FormSection>

      <FormSection title="The season" intro="Report the breba crop and the main crop separately: they ripen on different wood at different times.">
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Season year" type="number" inputMode="numeric" hint="The year the fruit grew, e.g. 2025." error={errors.season?.message} {...register('season', { setValueAs: toNumber })} />
          <ChoiceGroup legend="Crop" error={errors.crop?.message}>
            {CROPS.map((code) => (
              <label key={code} className={choiceClass}>
                <input type="radio" value={code} className="accent-fig-600" {...register('crop')} />
                {LABELS.crop[code]}
              </label>
            ))}
          </ChoiceGroup>
        </div>
        <ChoiceGroup legend="Outcome" hint="What the best of this crop did this season." error={errors.outcome?.message}>
          {OUTCOMES.map((code) => (
            <label key={code} className={`${choiceClass} max-w-xs`} title={OUTCOME_HINTS[code]}>
              <input type="radio" value={code} className="accent-fig-600" {...register('outcome')} />
              <span>
                {LABELS.outcome[code]}
                <span className="block text-xs text-ink/70">{OUTCOME_HINTS[code]}</span>
              </span>
            </label>
          ))}
        </ChoiceGroup>
      </FormSection>

      <FormSection title="Dates (optional)" intro="All in the season year, in order: last spring frost, first ripe fig, last harvest, first fall frost. Frost dates you saw at the tree help where no weather station is near.">
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Last spring frost" type="date" hint="The last night it froze at the tree in spring." error={errors.springFrostDate?.message} {...register('springFrostDate')} />
          <FormField label="First ripe fig" type="date" hint="Only when the crop ripened." error={errors.firstRipeDate?.message} {...register('firstRipeDate')} />
          <FormField label="Last harvest" type="date" hint="The last fig you picked ripe." error={errors.lastHarvestDate?.message} {...register('lastHarvestDate')} />
          <FormField label="First fall frost" type="date" hint="The first frost that blackened the leaves." error={errors.fallFrostDate?.message} {...register('fallFrostDate')} />
        </div>
      </FormSection>

      <FormSection title="What you did (optional)">
        <div className="flex flex-col gap-2">
          <label className="flex items-center gap-2 text-sm font-medium">
            <input type="checkbox" className="h-4 w-4 accent-fig-600" {...register('pinched')} />
            I pinched the growing tips
          </label>
          <p className="text-xs text-ink/70">Pinching the tips in early summer can push figs to form and ripen sooner on the main crop.</p>
          <aside className="rounded-md border border-amber-soft bg-amber-soft/30 px-3 py-2 text-sm text-ink/85" aria-label="Safety">
            <strong className="font-medium">Take care:</strong> fig sap (latex) irritates skin and can burn it in sunlight. Wear gloves and long sleeves when pinching or pruning, and wash sap off with soap and water. Use a steady ladder with someone nearby; for any spray, follow the label and your local extension service’s advice.
          </aside>
          {pinched && <FormField label="Pinched on" type="date" hint="Roughly when, in the season year." error={errors.pinchedDate?.message} {...register('pinchedDate')} />}
          {!pinched && errors.pinchedDate && (
            <p role="alert" className="text-sm text-red-700">
              {errors.pinchedDate.message}
            </p>
          )}
        </div>
        <FormField label="Winter protection" hint="e.g. wrapped in burlap, moved into a garage, mulched the roots." error={errors.winterProtection?.message} {...register('winterProtection')} />
        <FormField label="Feeding" hint="e.g. compost in spring, no nitrogen after June." error={errors.feeding?.message} {...register('feeding')} />
        <FormField label="Watering" hint="e.g. deep weekly in July and August; rain only." error={errors.watering?.message} {...register('watering')} />
        <Field label="Notes" hint={`Anything others near you should know: taste, pests, a late frost. Up to ${NOTES_MAX} characters; shown with the report.`} error={errors.notes?.message}>
          {(props) => <textarea {...props} rows={4} className={inputClass} {...register('notes')} />}
        </Field>
      </FormSection>

      <FormSection title="Photos (optional)">
        <PhotoPicker
          files={files}
          onChange={(next) => {
            setFiles(next);
            setPhotoError(checkPhotoFiles(next, PHOTOS_PER_REPORT - existingPhotos.length));
          }}
          existing={existingPhotos}
          onDeleteExisting={report ? (photo) => window.confirm('Remove this photo?') && deletePhoto.mutate({ id: report.id, photoId: photo.id }) : undefined}
          error={photoError}
          progress={progress}
        />
      </FormSection>

      {formError && (
        <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm text-red-800">
          {formError}
        </p>
      )}
      <div className="flex items-center gap-3">
        <Button type="submit" disabled={busy}>
          {busy ? (progress !== null ? 'Uploading photos…' : 'Saving…') : editing ? 'Save changes' : 'Post report'}
        </Button>
        {errorCount > 0 && (
          <span className="text-sm text-red-700">
            {errorCount === 1 ? 'One field needs' : `${errorCount} fields need`} a look: see the messages in red above.
          </span>
        )}
      </div>
    </form>
  );
}
