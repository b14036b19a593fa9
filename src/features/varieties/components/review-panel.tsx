import { useState } from 'react';
import type { CatalogueEntry } from '@shared/schemas/varieties';
import { Button } from '../../../components/button';
import { inputClass } from '../../../components/form-field';
import { useAcceptVariety, useRejectVariety } from '../api';
import { MergePanel } from './merge-panel';
import { VarietyForm } from './variety-form';
import { countOf } from '@shared/domain/plural';

type Choice = 'accept' | 'merge' | 'reject';

/** A name a grower proposed: accept it (filling in the details), merge it into a known variety, or reject it with a reason. */
export function ReviewPanel({ variety, onDone, onCancel }: { variety: CatalogueEntry; onDone: (message: string) => void; onCancel: () => void }) {
  const [choice, setChoice] = useState<Choice>('accept');
  const accept = useAcceptVariety();
  const reject = useRejectVariety();
  const [reason, setReason] = useState('');

  return (
    <div className="flex flex-col gap-4">
      <p className="text-sm text-ink/80">
        {variety.status === 'rejected' ? 'Rejected earlier; you can still accept or merge it. ' : ''}Proposed{variety.proposedBy ? ` by ${variety.proposedBy}` : ''} with {countOf(variety.reportCount, 'report')}.
        {variety.notes && <> Note: {variety.notes}</>}
      </p>
      <div role="radiogroup" aria-label="Decision" className="flex flex-wrap gap-2">
        {(variety.status === 'rejected' ? (['accept', 'merge'] as const) : (['accept', 'merge', 'reject'] as const)).map((c) => (
          <label key={c} className="flex cursor-pointer items-center gap-2 rounded-md border border-fig-200 bg-white px-3 py-1.5 text-sm has-[:checked]:border-fig-600 has-[:checked]:bg-fig-50">
            <input type="radio" name="decision" checked={choice === c} onChange={() => setChoice(c)} />
            {c === 'accept' ? 'Accept as a new variety' : c === 'merge' ? 'Same as a known variety: merge' : 'Reject'}
          </label>
        ))}
      </div>
      {choice === 'accept' && (
        <VarietyForm
          mode="accept"
          variety={variety}
          isPending={accept.isPending}
          onCancel={onCancel}
          onSubmit={(input) => accept.mutateAsync({ id: variety.id, input }).then(() => onDone(`Accepted “${input.name}”.`))}
        />
      )}
      {choice === 'merge' && <MergePanel variety={variety} onDone={onDone} onCancel={onCancel} />}
      {choice === 'reject' && (
        <form
          className="flex flex-col gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            reject.mutate({ id: variety.id, reason }, { onSuccess: () => onDone(`Rejected “${variety.name}”.`) });
          }}
        >
          <label className="flex flex-col gap-1 text-sm">
            <span className="font-medium">Reason</span>
            <textarea className={inputClass} rows={2} value={reason} onChange={(e) => setReason(e.target.value)} />
            <span className="text-xs text-ink/70">The grower sees this. Their reports keep the name, but the atlas only counts accepted varieties.</span>
          </label>
          {reject.error && <p role="alert" className="text-sm text-red-700">{reject.error.message}</p>}
          <div className="flex gap-2">
            <Button type="submit" variant="danger" disabled={reject.isPending}>
              Reject name
            </Button>
            <Button type="button" variant="secondary" onClick={onCancel}>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </div>
  );
}
