import { useQuery } from '@tanstack/react-query';
import type { ModelAccuracy } from '@shared/schemas/accuracy';
import { MethodNote } from '../../../components/method-note';
import { accuracyQueries } from '../api';
import { ReliabilityChart } from './reliability-chart';

const fixed = (x: number, places = 3) => x.toFixed(places);
const ROWS: { key: keyof NonNullable<ModelAccuracy['scores']>; label: string }[] = [
  { key: 'chance', label: 'The chance shown in What ripens here' },
  { key: 'overallRate', label: 'The variety’s overall rate, everywhere' },
  { key: 'adjustedShare', label: 'The adjusted share the atlas ranked by before' },
];

/** The public accuracy page: leave-one-grower-out scores, skill and the reliability diagram. */
export function AccuracyView() {
  const { data, error, isLoading } = useQuery(accuracyQueries.current());
  if (isLoading) return <p className="text-sm text-ink/70">Loading…</p>;
  if (error) return <p className="text-sm text-red-700">{error.message}</p>;
  if (!data) return null;
  if (data.status === 'pending' || !data.scores) {
    return <p className="rounded-lg border border-fig-100 bg-white p-4 text-sm">The figures have not been worked out yet: a background job does it after reports change. Look again in a few minutes.</p>;
  }
  const when = data.computedAt ? new Date(data.computedAt).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' }) : '';
  const skill = data.brierSkillScore;
  const checked = data.bins.filter((b) => b.count >= 30 && b.meanPredicted !== null && b.observed !== null);
  const worst = checked.reduce((m, b) => Math.max(m, Math.abs(b.observed! - b.meanPredicted!)), 0);
  return (
    <div className="flex flex-col gap-6">
      {data.demoShare > 0 && (
        <p role="note" className="rounded-lg border border-amber-300 bg-amber-50 p-3 text-sm text-amber-950">
          {data.demoShare >= 0.999 ? 'All' : `${Math.round(data.demoShare * 100)} % of`} these figures come from the invented demo data: they show how the check works, not how good
          the odds are for real gardens.
        </p>
      )}
      <p className="text-sm">
        Worked out on {when} from <strong>{data.treeSeasons.toLocaleString()}</strong> tree-seasons ({data.trees.toLocaleString()} trees of {data.growers.toLocaleString()} growers). Each grower’s
        trees were predicted by a model that had never seen that grower’s reports.
      </p>
      <section aria-labelledby="scores-title" className="rounded-lg border border-fig-100 bg-white p-4">
        <h2 id="scores-title" className="font-semibold text-fig-900">
          Scores (lower is better)
        </h2>
        <div className="mt-2 overflow-x-auto">
          <table className="w-full text-left text-sm">
            <thead>
              <tr className="border-b border-fig-100 text-xs text-ink/70">
                <th className="py-1 pr-3 font-medium">Forecast</th>
                <th className="py-1 pr-3 text-right font-medium">Brier score</th>
                <th className="py-1 text-right font-medium">Log loss</th>
              </tr>
            </thead>
            <tbody>
              {ROWS.map((row) => (
                <tr key={row.key} className="border-b border-fig-50 last:border-0">
                  <td className="py-1 pr-3">{row.label}</td>
                  <td className="py-1 pr-3 text-right tabular-nums">{fixed(data.scores![row.key].brier)}</td>
                  <td className="py-1 text-right tabular-nums">{fixed(data.scores![row.key].logLoss)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <p className="mt-3 text-sm">
          Brier skill score against the variety’s overall rate: <strong className="tabular-nums">{skill === null ? 'not defined' : fixed(skill)}</strong>
          {skill !== null && (skill > 0 ? ' — the chance does better than simply quoting how often the variety ripens everywhere.' : ' — the chance does no better than the variety’s overall rate.')}
        </p>
      </section>
      <section aria-labelledby="reliability-title" className="rounded-lg border border-fig-100 bg-white p-4">
        <h2 id="reliability-title" className="font-semibold text-fig-900">
          Does a 70 % chance come true 7 times in 10?
        </h2>
        <ReliabilityChart bins={data.bins} />
        <p className="text-xs text-ink/70">
          Each dot is one tenth of the chances given (its area follows the number of tree-seasons); on the dashed diagonal the chance means exactly what it says.
          {checked.length > 0 && ` In ${checked.length === 1 ? 'the one tenth' : `the ${checked.length} tenths`} with 30 or more tree-seasons the chance is off by at most ${Math.round(worst * 100)} points.`}
        </p>
        <div className="mt-2 overflow-x-auto">
          <table className="w-full text-right text-xs tabular-nums">
            <caption className="sr-only">Reliability bins</caption>
            <thead>
              <tr className="border-b border-fig-100 text-ink/70">
                <th className="py-1 text-left font-medium">Chance given</th>
                <th className="py-1 font-medium">Tree-seasons</th>
                <th className="py-1 font-medium">Mean chance</th>
                <th className="py-1 font-medium">Edible crop seen</th>
              </tr>
            </thead>
            <tbody>
              {data.bins.map((b) => (
                <tr key={b.from} className="border-b border-fig-50 last:border-0">
                  <td className="py-0.5 text-left">
                    {Math.round(b.from * 100)}–{Math.round(b.to * 100)} %
                  </td>
                  <td className="py-0.5">{b.count}</td>
                  <td className="py-0.5">{b.meanPredicted === null ? '–' : `${Math.round(b.meanPredicted * 100)} %`}</td>
                  <td className="py-0.5">{b.observed === null ? '–' : `${Math.round(b.observed * 100)} %`}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
      <MethodNote method={data.method}>
        A tree-season is one tree reported in one season; it counts as an edible crop when a crop that can set fruit there ripened. The Brier score is the mean squared gap
        between the chance and what happened (0 is perfect); the log loss punishes confident misses hardest.
      </MethodNote>
    </div>
  );
}
