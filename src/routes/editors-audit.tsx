import { AuditTable } from '../features/audit/components/audit-table';

export default function EditorsAuditRoute() {
  return (
    <div className="mx-auto flex max-w-6xl flex-col gap-5 px-4 py-8">
      <div>
        <h1 className="text-2xl font-semibold text-fig-900">Audit log</h1>
        <p className="mt-1 max-w-2xl text-ink/80">Every editor and admin action, and every change to a report: who, when, what, and the values before and after. Entries are never edited or removed.</p>
      </div>
      <AuditTable />
    </div>
  );
}
