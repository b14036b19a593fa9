import { useId, type ReactNode } from 'react';
import { describedBy, HintAndError } from '../../../components/form-field';

/** A group of radio buttons with a legend, a hint and an error. */
export function ChoiceGroup({ legend, hint, error, children }: { legend: string; hint?: ReactNode; error?: string; children: ReactNode }) {
  const id = useId();
  return (
    <fieldset className="flex flex-col gap-1" aria-describedby={describedBy(id, hint, error)} data-invalid={error ? true : undefined}>
      <legend className="mb-1 text-sm font-medium text-ink">{legend}</legend>
      <div className="flex flex-wrap gap-2">{children}</div>
      <HintAndError id={id} hint={hint} error={error} />
    </fieldset>
  );
}

export const choiceClass =
  'flex cursor-pointer items-center gap-2 rounded-md border border-fig-200 bg-white px-3 py-1.5 text-sm has-[:checked]:border-fig-600 has-[:checked]:bg-fig-50 has-[:checked]:text-fig-700';

/** A titled part of a long form. */
export function FormSection({ title, intro, children }: { title: string; intro?: ReactNode; children: ReactNode }) {
  return (
    <section className="rounded-lg border border-fig-100 bg-white/70 p-5">
      <h2 className="text-lg font-semibold text-fig-900">{title}</h2>
      {intro && <p className="mt-1 text-sm text-ink/75">{intro}</p>}
      <div className="mt-4 flex flex-col gap-4">{children}</div>
    </section>
  );
}
