import { RequireRole } from '../features/auth/components/require-role';
import { SupportersSummary } from '../features/support/components/supporters-summary';

export default function EditorsSupportersRoute() {
  return (
    <RequireRole role="admin">
      <div className="mx-auto max-w-4xl px-4 py-6">
        <SupportersSummary />
      </div>
    </RequireRole>
  );
}
