import { useNavigate } from 'react-router';
import { Page } from '../components/page';
import { RequireRole } from '../features/auth/components/require-role';
import { ReportForm } from '../features/reports/components/report-form';

export default function ReportNewRoute() {
  const navigate = useNavigate();
  return (
    <RequireRole role="grower">
      <Page title="Post a harvest report" intro="What did your fig tree do this season? Every report, ripe or not, helps growers near you choose.">
        <div className="max-w-2xl">
          <ReportForm onSaved={(result) => navigate(`/reports/${result.id}`, { state: result })} />
        </div>
      </Page>
    </RequireRole>
  );
}
