import { useState } from 'react';
import { useNavigate } from 'react-router';
import { Page } from '../components/page';
import { RequireRole } from '../features/auth/components/require-role';
import { ReportForm } from '../features/reports/components/report-form';
import { KeptNotice } from '../features/report-outbox/components/kept-notice';

export default function ReportNewRoute() {
  const navigate = useNavigate();
  // Without a connection the report stays on the phone; a new blank form starts after the notice.
  const [kept, setKept] = useState(0);
  const [showKept, setShowKept] = useState(false);
  return (
    <RequireRole role="grower">
      <Page title="Post a harvest report" intro="What did your fig tree do this season? Every report, ripe or not, helps growers near you choose.">
        <div className="max-w-2xl">
          {showKept ? (
            <KeptNotice onAnother={() => setShowKept(false)} />
          ) : (
            <ReportForm
              key={kept}
              onSaved={(result) => navigate(`/reports/${result.id}`, { state: result })}
              onKept={() => {
                setKept((n) => n + 1);
                setShowKept(true);
              }}
            />
          )}
        </div>
      </Page>
    </RequireRole>
  );
}
