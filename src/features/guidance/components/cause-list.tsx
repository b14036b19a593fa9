import type { Cause } from '@shared/schemas/diagnosis';
import { CautionBox } from './caution-box';

const BADGE: Record<Cause['likelihood'], string> = {
  high: 'bg-fig-600 text-white',
  medium: 'bg-fig-100 text-fig-700',
  low: 'bg-paper text-ink/70 ring-1 ring-fig-100',
};
const WORDS: Record<Cause['likelihood'], string> = { high: 'Most likely', medium: 'Possible', low: 'Less likely' };

/** Likely causes, most likely first, each with what to try next season and its cautions. */
export function CauseList({ causes }: { causes: Cause[] }) {
  return (
    <ol className="flex flex-col gap-3" aria-label="Likely causes">
      {causes.map((c, i) => (
        <li key={c.code} className="rounded-lg border border-fig-100 bg-white p-4" data-testid="cause">
          <div className="flex flex-wrap items-baseline gap-2">
            <span className="text-sm font-semibold text-ink/70">{i + 1}.</span>
            <h3 className="text-lg font-semibold text-fig-900">{c.title}</h3>
            <span className={`ml-auto rounded-full px-2 py-0.5 text-xs font-medium ${BADGE[c.likelihood]}`}>{WORDS[c.likelihood]}</span>
          </div>
          <p className="mt-1 text-ink/90">{c.why}</p>
          {c.tryNext.length > 0 && (
            <>
              <p className="mt-2 text-sm font-medium text-leaf-700">Next season, try</p>
              <ul className="ml-5 list-disc text-sm">
                {c.tryNext.map((t) => (
                  <li key={t}>{t}</li>
                ))}
              </ul>
            </>
          )}
          {c.cautions.length > 0 && (
            <div className="mt-3">
              <CautionBox kinds={c.cautions} />
            </div>
          )}
        </li>
      ))}
    </ol>
  );
}
