import { useEffect, useId, useRef, type InputHTMLAttributes, type ReactNode, type RefObject } from 'react';

export const inputClass =
  'rounded-md border border-fig-200 bg-white px-3 py-2 text-base shadow-sm focus:border-fig-500 focus:outline-none aria-invalid:border-red-600';

/** The ids a control names in aria-describedby: its hint and its error, those it has. */
export function describedBy(id: string, hint: ReactNode, error: string | undefined): string | undefined {
  return [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
}

/** The hint under a control and its error in plain words, with the ids `describedBy` names. */
export function HintAndError({ id, hint, error }: { id: string; hint?: ReactNode; error?: string }) {
  return (
    <>
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-ink/70">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} role="alert" className="text-sm text-red-700">
          {error}
        </p>
      )}
    </>
  );
}

/** A labelled control with a hint under it and its error in plain words (for selects, text areas, groups). */
export function Field({ label, hint, error, children }: { label: string; hint?: ReactNode; error?: string; children: (props: { id: string; 'aria-describedby'?: string; 'aria-invalid'?: true }) => ReactNode }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      {children({ id, 'aria-describedby': describedBy(id, hint, error), 'aria-invalid': error ? true : undefined })}
      <HintAndError id={id} hint={hint} error={error} />
    </div>
  );
}

interface FormFieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  hint?: ReactNode;
  error?: string;
}

/** A labelled input with a hint under it and the field's error in plain words. */
export function FormField({ label, hint, error, ...input }: FormFieldProps) {
  return (
    <Field label={label} hint={hint} error={error}>
      {(control) => <input className={inputClass} {...control} {...input} />}
    </Field>
  );
}

/**
 * After a submit that failed the checks, move focus to the first field marked invalid in page order
 * (an input with aria-invalid, or the first choice of a radio group marked data-invalid), so the
 * grower lands on the first problem instead of wherever the form library registered a field first.
 * Pass react-hook-form's submitCount and isSubmitting; each submit moves focus once, when its checks end.
 */
export function useFocusFirstInvalid(formRef: RefObject<HTMLFormElement | null>, { submitCount, isSubmitting, hasErrors }: { submitCount: number; isSubmitting: boolean; hasErrors: boolean }) {
  const handled = useRef(0);
  useEffect(() => {
    if (isSubmitting || submitCount === handled.current) return;
    handled.current = submitCount;
    if (!hasErrors) return;
    const first = formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"], fieldset[data-invalid]');
    const target = first?.matches('fieldset') ? first.querySelector<HTMLElement>('input, select, textarea') : first;
    target?.focus();
    target?.scrollIntoView?.({ block: 'center' });
  }, [formRef, submitCount, isSubmitting, hasErrors]);
}
