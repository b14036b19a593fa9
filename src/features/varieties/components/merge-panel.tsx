import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { CatalogueEntry } from '@shared/schemas/varieties';
import { Button } from '../../../components/button';
import { inputClass } from '../../../components/form-field';
import { useMergeVariety, varietyQueries } from '../api';

/** Merge one entry into an accepted variety; says exactly what will move before it happens. */
export function MergePanel({ variety, onDone, onCancel }: { variety: CatalogueEntry; onDone: (message: string) => void; onCancel: () => void }) {
  const { data } = useQuery(varietyQueries.accepted());
  const merge = useMergeVariety();
  const [intoId, setIntoId] = useState<number | ''>('');
  const targets = (data?.varieties ?? []).filter((v) => v.id !== variety.id);
  const target = targets.find((v) => v.id === intoId);
  const names = [variety.name, ...variety.synonyms];

  return (
    <div className="flex flex-col gap-3">
      <label className="flex flex-col gap-1 text-sm">
        <span className="font-medium">Keep this variety</span>
        <select className={inputClass} value={intoId} onChange={(e) => setIntoId(e.target.value ? Number(e.target.value) : '')}>
          <option value="">Choose the variety to keep…</option>
          {targets.map((v) => (
            <option key={v.id} value={v.id}>
              {v.name}
              {v.synonyms.length ? ` (also ${v.synonyms.join(', ')})` : ''}
            </option>
          ))}
        </select>
        <span className="text-xs text-ink/70">Only accepted varieties can be kept.</span>
      </label>
      {target && (
        <p className="rounded-md bg-fig-50 p-3 text-sm">
          {variety.reportCount} report{variety.reportCount === 1 ? '' : 's'} move to <strong>{target.name}</strong>; {names.map((n) => `“${n}”`).join(', ')} become{names.length === 1 ? 's' : ''} its synonym{names.length === 1 ? '' : 's'}. “{variety.name}” stays in the catalogue as merged, so nothing is lost.
        </p>
      )}
      {merge.error && <p role="alert" className="text-sm text-red-700">{merge.error.message}</p>}
      <div className="flex gap-2">
        <Button
          type="button"
          disabled={!target || merge.isPending}
          onClick={() =>
            merge.mutate({ id: variety.id, intoId: Number(intoId) }, { onSuccess: (r) => onDone(`Merged “${variety.name}” into “${r.kept.name}”: ${r.movedReports} report(s) moved.`) })
          }
        >
          {merge.isPending ? 'Merging…' : 'Merge'}
        </Button>
        <Button type="button" variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </div>
  );
}
