import { Page } from '../components/page';
import { RequireRole } from '../features/auth/components/require-role';
import { ImportForm } from '../features/reports/components/import-form';

export default function ReportImportRoute() {
  return (
    <RequireRole role="grower">
      <Page wide title="Import past seasons" intro="Kept notes in a spreadsheet? Upload them as CSV: one row per tree, season and crop.">
        <ImportForm />
      </Page>
    </RequireRole>
  );
}
