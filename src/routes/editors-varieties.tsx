import { useMemo, useState } from 'react';
import { useSearchParams } from 'react-router';
import { VARIETY_STATUSES, type VarietyStatus } from '@shared/domain/codes';
import type { CatalogueEntry } from '@shared/schemas/varieties';
import { Button } from '../components/button';
import { useCreateVariety, useUpdateVariety } from '../features/varieties/api';
import { CatalogueImport } from '../features/varieties/components/catalogue-import';
import { CatalogueTable } from '../features/varieties/components/catalogue-table';
import { MergePanel } from '../features/varieties/components/merge-panel';
import { ReviewPanel } from '../features/varieties/components/review-panel';
import { VarietyForm } from '../features/varieties/components/variety-form';

type Panel = { kind: 'create' } | { kind: 'edit' | 'merge' | 'review'; variety: CatalogueEntry } | null;

const TITLES = { create: 'New variety', edit: 'Edit', merge: 'Merge', review: 'Review proposed name' } as const;

export default function EditorsVarietiesRoute() {
  const [params, setParams] = useSearchParams();
  const statusParam = params.get('status');
  const status: VarietyStatus | '' = (VARIETY_STATUSES as readonly string[]).includes(statusParam ?? '') ? (statusParam as VarietyStatus) : '';
  const [panel, setPanel] = useState<Panel>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const create = useCreateVariety();
  const update = useUpdateVariety();
  const done = (message: string) => {
    setPanel(null);
    setNotice(message);
  };
  const actions = useMemo(
    () => ({
      onEdit: (variety: CatalogueEntry) => setPanel({ kind: 'edit', variety }),
      onMerge: (variety: CatalogueEntry) => setPanel({ kind: 'merge', variety }),
      onReview: (variety: CatalogueEntry) => setPanel({ kind: 'review', variety }),
    }),
    [],
  );

  return (
    <div className="mx-auto flex max-w-6xl flex-col gap-5 px-4 py-8">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold text-fig-900">Variety catalogue</h1>
          <p className="mt-1 max-w-2xl text-ink/80">
            Keep one entry per variety, with a source for each claim. Review the names growers proposed, and merge entries that turn out to be the same tree.
          </p>
        </div>
        <div className="flex gap-2">
          <Button variant="secondary" onClick={() => setParams(status === 'proposed' ? {} : { status: 'proposed' })}>
            {status === 'proposed' ? 'Show all' : 'Proposed names'}
          </Button>
          <Button onClick={() => setPanel({ kind: 'create' })}>New variety</Button>
        </div>
      </div>
      {notice && (
        <p role="status" className="rounded-md bg-leaf-100 px-3 py-2 text-sm text-leaf-700">
          {notice}
        </p>
      )}
      {panel && (
        <section aria-label={TITLES[panel.kind]} className="rounded-lg border border-fig-200 bg-white p-5 shadow-sm">
          <h2 className="mb-4 text-lg font-semibold text-fig-900">
            {TITLES[panel.kind]}
            {panel.kind !== 'create' && <> “{panel.variety.name}”</>}
          </h2>
          {panel.kind === 'create' && (
            <VarietyForm mode="create" isPending={create.isPending} onCancel={() => setPanel(null)} onSubmit={(input) => create.mutateAsync(input).then((r) => done(`Added “${r.variety.name}”.`))} />
          )}
          {panel.kind === 'edit' && (
            <VarietyForm
              key={panel.variety.id}
              mode="edit"
              variety={panel.variety}
              isPending={update.isPending}
              onCancel={() => setPanel(null)}
              onSubmit={(input) => update.mutateAsync({ id: panel.variety.id, input }).then((r) => done(`Saved “${r.variety.name}”.`))}
            />
          )}
          {panel.kind === 'merge' && <MergePanel key={panel.variety.id} variety={panel.variety} onDone={done} onCancel={() => setPanel(null)} />}
          {panel.kind === 'review' && <ReviewPanel key={panel.variety.id} variety={panel.variety} onDone={done} onCancel={() => setPanel(null)} />}
        </section>
      )}
      <CatalogueTable status={status} onStatusChange={(s) => setParams(s ? { status: s } : {})} actions={actions} />
      <CatalogueImport />
    </div>
  );
}
