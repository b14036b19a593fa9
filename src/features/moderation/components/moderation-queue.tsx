import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Link } from 'react-router';
import { LABELS } from '@shared/domain/codes';
import { SUSPICION_RULES, type SuspicionRule } from '@shared/domain/moderation-rules';
import { MODERATION_KINDS, type ModerationItem, type ModerationKind } from '@shared/schemas/moderation';
import { Button } from '../../../components/button';
import { Field, inputClass } from '../../../components/form-field';
import { filterClass, Pager, type PageState } from '../../editors/components/data-table';
import { moderationQueries, useClearFlag, useHideFromQueue, useMarkReviewed, useRestoreFromQueue } from '../api';
import { DateText } from '../../units/components/date-text';
import { VarietyLink } from '../../varieties/components/variety-link';

const KIND_LABEL: Record<ModerationKind, string> = { all: 'Needs a look', flagged: 'Flagged by growers', suspicious: 'Picked out by the rules', hidden: 'Hidden' };
const RULE_LABEL: Record<SuspicionRule, string> = {
  'dates-out-of-order': 'Dates out of order',
  'too-early': 'Ripe too early for the variety',
  'season-too-short': 'Season too short for the variety',
  'neighbour-outlier': 'Unlike nearby reports',
};

/** Flagged reports and reports the rules picked out, one card each with its reasons and actions. */
export function ModerationQueue({ initialKind = 'all' }: { initialKind?: ModerationKind }) {
  const [kind, setKind] = useState<ModerationKind>(initialKind);
  const [rule, setRule] = useState<SuspicionRule | ''>('');
  const [page, setPage] = useState<PageState>({ limit: 10, offset: 0 });
  const { data, isLoading, error } = useQuery(moderationQueries.queue({ kind, rule: rule || undefined, ...page }));
  const items = data?.items ?? [];

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <div role="tablist" aria-label="Queue" className="flex flex-wrap gap-1">
          {MODERATION_KINDS.map((k) => (
            <button
              key={k}
              type="button"
              role="tab"
              aria-selected={kind === k}
              className={`rounded-md px-3 py-1.5 text-sm ${kind === k ? 'bg-fig-100 font-medium text-fig-700' : 'text-ink/80 hover:bg-fig-50'}`}
              onClick={() => {
                setKind(k);
                setPage((p) => ({ ...p, offset: 0 }));
              }}
            >
              {KIND_LABEL[k]}
            </button>
          ))}
        </div>
        {kind !== 'hidden' && kind !== 'flagged' && (
          <label className="flex flex-col text-sm">
            <span className="font-medium">Rule</span>
            <select className={filterClass} value={rule} onChange={(e) => { setRule(e.target.value as SuspicionRule | ''); setPage((p) => ({ ...p, offset: 0 })); }}>
              <option value="">Any rule</option>
              {SUSPICION_RULES.map((r) => (
                <option key={r} value={r}>
                  {RULE_LABEL[r]}
                </option>
              ))}
            </select>
          </label>
        )}
      </div>
      {error && <p role="alert" className="text-sm text-red-700">{error.message}</p>}
      {isLoading && <p className="text-ink/70">Loading the queue…</p>}
      {!isLoading && items.length === 0 && <p className="rounded-lg border border-fig-100 bg-white p-6 text-center text-ink/70">Nothing here. The atlas looks tidy.</p>}
      <ul className="flex flex-col gap-3">
        {items.map((item) => (
          <li key={item.report.id}>
            <QueueCard item={item} />
          </li>
        ))}
      </ul>
      {items.length > 0 && (
        <div className="rounded-lg border border-fig-100 bg-white">
          <Pager page={page} total={data?.total ?? 0} first={page.offset + 1} last={page.offset + items.length} onPageChange={setPage} />
        </div>
      )}
    </div>
  );
}

function QueueCard({ item }: { item: ModerationItem }) {
  const { report, flags, suspicions } = item;
  const hide = useHideFromQueue();
  const restore = useRestoreFromQueue();
  const clear = useClearFlag();
  const reviewed = useMarkReviewed();
  const [hiding, setHiding] = useState(false);
  const [reason, setReason] = useState(suspicions[0]?.message ?? '');
  const failure = hide.error ?? restore.error ?? clear.error ?? reviewed.error;
  const dates = [
    ['Spring frost', report.springFrostDate],
    ['First ripe', report.firstRipeDate],
    ['Last harvest', report.lastHarvestDate],
    ['Fall frost', report.fallFrostDate],
  ] as const;

  return (
    <article aria-label={`Report ${report.id}`} className="rounded-lg border border-fig-100 bg-white p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold text-fig-900">
          {report.varietyId ? <VarietyLink id={report.varietyId} name={report.varietyName ?? 'Unnamed variety'} /> : (report.varietyName ?? 'Unnamed variety')} · {report.season} {report.crop === 'breba' ? 'breba' : 'main crop'} · {LABELS.outcome[report.outcome]}
        </h3>
        <span className="text-xs text-ink/70">
          <Link to={`/reports/${report.id}`} className="text-fig-700 underline">
            Report #{report.id}
          </Link>{' '}
          by {report.grower} · {LABELS.growingForm[report.form]} · {report.lat.toFixed(3)}, {report.lon.toFixed(3)}
        </span>
      </div>
      <dl className="mt-2 flex flex-wrap gap-x-5 gap-y-1 text-sm">
        {dates.map(([label, value]) => (
          <div key={label} className="flex gap-1">
            <dt className="text-ink/70">{label}</dt>
            <dd className="tabular-nums">
              <DateText iso={value} />
            </dd>
          </div>
        ))}
      </dl>
      {report.notes && <p className="mt-1 text-sm text-ink/80">“{report.notes}”</p>}
      {suspicions.length > 0 && (
        <ul className="mt-2 flex flex-col gap-1 text-sm">
          {suspicions.map((s) => (
            <li key={s.rule} className="rounded bg-amber-soft/60 px-2 py-1">
              <strong>{RULE_LABEL[s.rule]}:</strong> {s.message}
            </li>
          ))}
        </ul>
      )}
      {flags.length > 0 && (
        <ul className="mt-2 flex flex-col gap-1 text-sm">
          {flags.map((f) => (
            <li key={f.id} className="flex flex-wrap items-center justify-between gap-2 rounded bg-fig-50 px-2 py-1">
              <span>
                <strong>Flag</strong> from {f.flaggedBy ?? 'a former account'} (<DateText iso={f.createdAt} />): {f.reason}
              </span>
              <button type="button" className="rounded px-2 py-0.5 text-fig-700 hover:bg-white" onClick={() => clear.mutate(f.id)} disabled={clear.isPending}>
                Clear flag
              </button>
            </li>
          ))}
        </ul>
      )}
      {report.status === 'hidden' && (
        <p className="mt-2 text-sm text-ink/80">
          Hidden {report.hiddenAt?.slice(0, 10)}. Reason shown to the grower: “{report.hiddenReason}”
        </p>
      )}
      {failure && <p role="alert" className="mt-2 text-sm text-red-700">{failure.message}</p>}
      <div className="mt-3 flex flex-wrap items-start gap-2">
        {report.status === 'hidden' ? (
          <Button variant="secondary" onClick={() => restore.mutate(report.id)} disabled={restore.isPending}>
            Restore
          </Button>
        ) : hiding ? (
          <form
            className="flex w-full flex-col gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              hide.mutate({ id: report.id, reason });
            }}
          >
            <Field label="Reason the grower will see" hint="Plain and specific, e.g. “The first ripe date comes before the spring frost: please check the dates.” The grower can correct the report.">
              {(props) => <textarea {...props} autoFocus className={inputClass} rows={2} value={reason} onChange={(e) => setReason(e.target.value)} />}
            </Field>
            <div className="flex gap-2">
              <Button type="submit" variant="danger" disabled={hide.isPending}>
                Hide report
              </Button>
              <Button type="button" variant="secondary" onClick={() => setHiding(false)}>
                Cancel
              </Button>
            </div>
          </form>
        ) : (
          <>
            <Button variant="secondary" onClick={() => setHiding(true)}>
              Hide…
            </Button>
            {suspicions.length > 0 && (
              <Button variant="quiet" onClick={() => reviewed.mutate(report.id)} disabled={reviewed.isPending}>
                Looks fine
              </Button>
            )}
          </>
        )}
      </div>
    </article>
  );
}
