import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { LABELS, type Outcome } from '@shared/domain/codes';
import { countOf } from '@shared/domain/plural';
import type { Report, ReportListItem } from '@shared/schemas/reports';
import { reportQueries } from '../api';

/** Outcome marks readable without colour: a word, and a shape beside the colour. */
const OUTCOME_MARK: Record<Outcome, { shape: string; className: string }> = {
  ripened: { shape: '●', className: 'bg-leaf-100 text-leaf-700' },
  unripe: { shape: '◐', className: 'bg-amber-soft/50 text-ink' },
  dropped: { shape: '◌', className: 'bg-fig-50 text-fig-700' },
  'no-fruit': { shape: '○', className: 'bg-paper text-ink/80 ring-1 ring-fig-100' },
};

/**
 * A tree's seasons together: every report of the same tree the viewer may see (its owner sees
 * drafts too), season by season, breba and main crop side by side, this report marked.
 */
export function TreeTimeline({ report }: { report: Report }) {
  const list = useQuery(reportQueries.list({ treeId: report.treeId, mine: report.viewer.isOwner ? 'true' : 'false', sort: 'season', dir: 'asc', pageSize: 200 }));
  const reports = list.data?.reports ?? [];
  if (list.isLoading || reports.length === 0) return null;
  const seasons = [...new Set(reports.map((r) => r.season))].sort((a, b) => a - b);
  const bySeason = new Map<number, ReportListItem[]>(seasons.map((season) => [season, reports.filter((r) => r.season === season).sort((a, b) => (a.crop === 'breba' ? -1 : b.crop === 'breba' ? 1 : 0))]));
  return (
    <section className="rounded-lg border border-fig-100 bg-white p-5" aria-labelledby="tree-timeline-title">
      <h2 id="tree-timeline-title" className="text-lg font-semibold text-fig-900">
        This tree over the seasons
      </h2>
      <p className="mt-1 text-sm text-ink/70">
        {countOf(reports.length, 'report')} of this tree in {countOf(seasons.length, 'season')}
        {report.viewer.isOwner ? ' (yours, drafts included)' : ''}.
      </p>
      <ol className="mt-3 flex gap-3 overflow-x-auto pb-2" aria-label="Seasons of this tree" data-testid="tree-timeline">
        {seasons.map((season) => (
          <li key={season} className="flex min-w-[8.5rem] flex-col gap-1.5 rounded-md border border-fig-100 p-2">
            <span className="text-sm font-semibold text-fig-900">{season}</span>
            {bySeason.get(season)!.map((r) => {
              const mark = OUTCOME_MARK[r.outcome];
              const current = r.id === report.id;
              const text = `${r.crop === 'breba' ? 'Breba' : 'Main crop'}: ${LABELS.outcome[r.outcome]}`;
              return current ? (
                <span key={r.id} aria-current="page" className={`rounded px-2 py-1 text-xs font-medium ring-2 ring-fig-500 ${mark.className}`}>
                  <span aria-hidden>{mark.shape} </span>
                  {text} <span className="sr-only">(this report)</span>
                </span>
              ) : (
                <Link key={r.id} to={`/reports/${r.id}`} className={`rounded px-2 py-1 text-xs underline-offset-2 hover:underline ${mark.className}`}>
                  <span aria-hidden>{mark.shape} </span>
                  {text}
                  {r.status !== 'published' ? ` (${r.status})` : ''}
                </Link>
              );
            })}
          </li>
        ))}
      </ol>
    </section>
  );
}
