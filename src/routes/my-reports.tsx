import { Link } from 'react-router';
import { Page } from '../components/page';
import { RequireRole } from '../features/auth/components/require-role';
import { MyReportsTable } from '../features/reports/components/my-reports-table';

export default function MyReportsRoute() {
  return (
    <RequireRole role="grower">
      <Page
        wide
        title="My reports"
        intro={
          <div className="flex flex-wrap items-center gap-3">
            <span>Every season you reported. Only you see the exact places and tree labels.</span>
            <Link to="/reports/new" className="rounded-md bg-fig-600 px-3 py-1.5 text-sm font-medium text-white hover:bg-fig-700">
              Post a report
            </Link>
            <Link to="/my/reports/import" className="text-sm text-fig-700 underline">
              Import a CSV of past seasons
            </Link>
          </div>
        }
      >
        <MyReportsTable />
      </Page>
    </RequireRole>
  );
}
