import { useQuery } from '@tanstack/react-query';
import { useNavigate, useParams } from 'react-router';
import { Page } from '../components/page';
import { RequireRole } from '../features/auth/components/require-role';
import { reportQueries } from '../features/reports/api';
import { ReportForm } from '../features/reports/components/report-form';

export default function ReportEditRoute() {
  const id = Number(useParams().id);
  const navigate = useNavigate();
  const report = useQuery(reportQueries.detail(id));
  return (
    <RequireRole role="grower">
      <Page title="Edit report">
        <div className="max-w-2xl">
          {report.isLoading && <p className="text-ink/70">Loading…</p>}
          {report.isError && <p role="alert">{report.error.message}</p>}
          {report.data && !report.data.report.viewer.isOwner && <p role="alert">Only the grower who wrote this report can edit it.</p>}
          {report.data?.report.viewer.isOwner && <ReportForm report={report.data.report} onSaved={(result) => navigate(`/reports/${result.id}`, { state: result })} />}
        </div>
      </Page>
    </RequireRole>
  );
}
