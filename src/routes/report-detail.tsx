import { useQuery } from '@tanstack/react-query';
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
