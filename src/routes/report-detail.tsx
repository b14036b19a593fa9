import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef } from 'react';
import { Link, useLocation, useParams } from 'react-router';
import { reportQueries } from '../features/reports/api';
import { ReportDetails } from '../features/reports/components/report-details';
import type { SavedResult } from '../features/reports/components/report-form';

export default function ReportDetailRoute() {
  const id = Number(useParams().id);
  const saved = (useLocation().state ?? null) as SavedResult | null;
  const report = useQuery(reportQueries.detail(id));
  return (
    <div className="h-full overflow-y-auto">
      <div className="mx-auto max-w-4xl px-4 py-8">
        {saved && <SavedConfirmation saved={saved} />}
        {saved?.notice && (
          <p role="status" className="mb-4 rounded-md bg-amber-soft/40 px-4 py-3 text-sm">
            {saved.notice}
          </p>
        )}
        {saved?.photoError && (
          <p role="alert" className="mb-4 rounded-md bg-red-50 px-4 py-3 text-sm text-red-800">
            {saved.photoError} <Link to={`/reports/${id}/edit`} className="underline">Try again from Edit</Link>.
          </p>
        )}
        {report.isLoading && <p className="text-ink/70">Loading…</p>}
        {report.isError && (
          <div>
            <h1 className="text-xl font-semibold">Report not found</h1>
            <p className="mt-2 text-ink/80">It may have been deleted, hidden by an editor, or still be a draft.</p>
          </div>
        )}
        {report.data && <ReportDetails report={report.data.report} />}
      </div>
    </div>
  );
}

/** A plain "it is done" after posting or saving, focused so a screen reader says it at once. */
function SavedConfirmation({ saved }: { saved: SavedResult }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => ref.current?.focus(), []);
  const published = saved.status === 'published';
  return (
    <div ref={ref} tabIndex={-1} role="status" data-testid="saved-confirmation" className="mb-4 rounded-md border border-leaf-300 bg-leaf-100 px-4 py-3 text-sm text-ink focus:outline-none">
      <p className="font-medium text-leaf-700">
        <span aria-hidden>✓ </span>
        {saved.action === 'posted' ? 'Thank you: your report is posted.' : 'Your changes are saved.'}
      </p>
      <p className="mt-1">
        {published ? 'It counts in the atlas now; everyone else sees it only on its 5 km grid cell.' : 'Only you see it until it is published.'}{' '}
        <Link to="/reports/new" className="font-medium text-fig-700 underline">
          Post another report
        </Link>{' '}
        ·{' '}
        <Link to="/my/reports" className="font-medium text-fig-700 underline">
          See all your reports
        </Link>
      </p>
    </div>
  );
}
