import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { FIG_TYPES, LABELS, RIPENING_CLASSES } from '@shared/domain/codes';
import { varietyInputSchema, type Variety, type VarietyFormValues, type VarietyInput } from '@shared/schemas/varieties';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { Field, FormField, inputClass } from '../../../components/form-field';

export type VarietyFormMode = 'create' | 'edit' | 'accept';

const SUBMIT_LABEL: Record<VarietyFormMode, string> = { create: 'Add variety', edit: 'Save changes', accept: 'Accept into the catalogue' };

function toDefaults(variety?: Partial<Variety>): VarietyFormValues {
  return {
    name: variety?.name ?? '',
    synonyms: variety?.synonyms ?? [],
    figType: variety?.figType ?? 'unknown',
    bearsBreba: variety?.bearsBreba ?? false,
    bearsMain: variety?.bearsMain ?? true,
    ripeningClass: variety?.ripeningClass ?? null,
    typicalDaysToRipen: variety?.typicalDaysToRipen ?? null,
    notes: variety?.notes ?? '',
    sources: variety?.sources ?? '',
  };
}

/** Create, edit or accept a variety: every claim (type, crops, ripening) needs a source. */
export function VarietyForm({ mode, variety, onSubmit, onCancel, isPending }: { mode: VarietyFormMode; variety?: Partial<Variety>; onSubmit: (input: VarietyInput) => Promise<unknown>; onCancel: () => void; isPending: boolean }) {
  const form = useForm<VarietyFormValues, unknown, VarietyInput>({ resolver: zodResolver(varietyInputSchema), defaultValues: toDefaults(variety) });
  const { errors } = form.formState;
  const defaults = form.formState.defaultValues;
  const [formError, setFormError] = useState<string | null>(null);

  const submit = form.handleSubmit(async (input) => {
    setFormError(null);
    try {
      await onSubmit(input);
    } catch (error) {
      if (error instanceof ApiError) {
        for (const [field, messages] of Object.entries(error.fields)) {
          if (field in input) form.setError(field as keyof VarietyInput, { message: messages.join(' ') });
        }
        setFormError(error.message);
      } else throw error;
    }
  });

  return (
    <form onSubmit={submit} noValidate className="grid gap-4 md:grid-cols-2" aria-label={`${SUBMIT_LABEL[mode]} form`}>
      <FormField label="Name" hint="The name most growers use; other names go under synonyms." error={errors.name?.message} {...form.register('name')} />
      <Controller
        control={form.control}
        name="synonyms"
        render={({ field }) => (
          <SynonymsInput value={field.value ?? []} onChange={field.onChange} error={errors.synonyms?.message ?? errors.synonyms?.[0]?.message} />
        )}
      />
      <Field label="Fig type" hint="Decides whether the crop needs the fig wasp." error={errors.figType?.message}>
        {(p) => (
          <select {...p} className={inputClass} defaultValue={defaults?.figType} {...form.register('figType')}>
            {FIG_TYPES.map((t) => (
              <option key={t} value={t}>
                {LABELS.figType[t]}
              </option>
            ))}
          </select>
        )}
      </Field>
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 text-sm font-medium">Crops it bears</legend>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...form.register('bearsBreba')} /> {LABELS.crop.breba}
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...form.register('bearsMain')} /> {LABELS.crop.main}
        </label>
        {errors.bearsMain && (
          <p role="alert" className="text-sm text-red-700">
            {errors.bearsMain.message}
          </p>
        )}
      </fieldset>
      <Field label="Ripening class" hint="Of the main crop, compared with other varieties." error={errors.ripeningClass?.message}>
        {(p) => (
          <select {...p} className={inputClass} defaultValue={defaults?.ripeningClass ?? ''} {...form.register('ripeningClass', { setValueAs: (v) => (v === '' || v === null ? null : v) })}>
            <option value="">Not known</option>
            {RIPENING_CLASSES.map((c) => (
              <option key={c} value={c}>
                {LABELS.ripeningClass[c]}
              </option>
            ))}
          </select>
        )}
      </Field>
      <FormField
        label="Typical days to ripen"
        type="number"
        inputMode="numeric"
        hint="From the last spring frost to the first ripe main-crop fig, where a source gives it (60–300)."
        error={errors.typicalDaysToRipen?.message}
        {...form.register('typicalDaysToRipen', { setValueAs: (v) => (v === '' || v === null ? null : Number(v)) })}
      />
      <Field label="Notes" hint="What growers should know; plain words." error={errors.notes?.message}>
        {(p) => <textarea {...p} rows={3} className={inputClass} {...form.register('notes')} />}
      </Field>
      <Field label="Sources" hint="One per line, for each claim above: handbook and page, extension publication, nursery catalogue. Needed for type and ripening claims." error={errors.sources?.message}>
        {(p) => <textarea {...p} rows={3} className={inputClass} {...form.register('sources')} />}
      </Field>
      {formError && (
        <p role="alert" className="text-sm text-red-700 md:col-span-2">
          {formError}
        </p>
      )}
      <div className="flex gap-2 md:col-span-2">
        <Button type="submit" disabled={isPending}>
          {isPending ? 'Saving…' : SUBMIT_LABEL[mode]}
        </Button>
        <Button type="button" variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function SynonymsInput({ value, onChange, error }: { value: string[]; onChange: (v: string[]) => void; error?: string }) {
  const [text, setText] = useState(value.join('; '));
  return (
    <FormField
      label="Synonyms"
      hint="Other names for the same variety, separated by semicolons."
      error={error}
      value={text}
      onChange={(e) => {
        setText(e.target.value);
        onChange(e.target.value.split(';').map((s) => s.trim()).filter(Boolean));
      }}
    />
  );
}
