import { lazy, Suspense, useState } from 'react';
import { Link, useNavigate } from 'react-router';
import { LABELS } from '@shared/domain/codes';
import type { Report } from '@shared/schemas/reports';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { useCurrentUser } from '../../auth/api';
import { useDeleteReport, useFlagReport, useHideReport, usePublishReport, useRestoreReport } from '../api';
import { inputClass } from '../../../components/form-field';
import { NearbyEvidence } from './nearby-evidence';
import { TreeTimeline } from './tree-timeline';
import { ReportMapSnippet } from './report-map-snippet';
import { useUnits } from '../../units/use-units';
import { VarietyLink } from '../../varieties/components/variety-link';

const MiniMap = lazy(() => import('./mini-map'));


export const reportTitle = (report: Pick<Report, 'variety' | 'proposedVarietyName'>) => report.variety?.name ?? report.proposedVarietyName ?? 'Unnamed variety';

/** One report's page: photos, place on the grid, the facts, and what the viewer may do with it. */
export function ReportDetails({ report }: { report: Report }) {
  const { viewer } = report;
  const units = useUnits();
  const formatDate = (iso: string | null) => (iso ? units.date(iso) : null);
  const facts: [string, string | null][] = [
    ['Season', `${report.season} · ${LABELS.crop[report.crop]}`],
    ['Outcome', LABELS.outcome[report.outcome]],
    ['Growing form', LABELS.growingForm[report.form]],
    ['Plant origin', LABELS.plantOrigin[report.origin]],
    ['Planted', report.yearPlanted ? String(report.yearPlanted) : null],
    ['Last spring frost', formatDate(report.springFrostDate)],
    ['First ripe fig', formatDate(report.firstRipeDate)],
    ['Last harvest', formatDate(report.lastHarvestDate)],
    ['First fall frost', formatDate(report.fallFrostDate)],
    ['Pinched the tips', report.pinched ? (formatDate(report.pinchedDate) ?? 'Yes') : 'No'],
    ['Winter protection', report.winterProtection || null],
    ['Feeding', report.feeding || null],
    ['Watering', report.watering || null],
  ];
  return (
    <article className="flex flex-col gap-6">
      <header>
        <p className="text-sm text-ink/70">
          Reported by {report.grower.displayName}
          {report.grower.supporter && (
            <span className="ml-1.5 rounded-full bg-leaf-100 px-2 py-0.5 text-xs font-medium text-leaf-700" title="This grower helps fund the atlas">
              supports the atlas
            </span>
          )}
          {report.treeLabel && ` · tree “${report.treeLabel}”`}
        </p>
        <h1 className="text-2xl font-semibold tracking-tight text-fig-900">
          {report.variety && report.variety.status === 'accepted' ? <VarietyLink id={report.variety.id} name={report.variety.name} /> : reportTitle(report)}{' '}
          <span className="font-normal text-ink/70">in {report.season}</span>
        </h1>
        {report.variety?.status === 'proposed' && <p className="mt-1 text-sm text-ink/70">A proposed name, waiting for an editor’s review.</p>}
      </header>

      <StatusNotice report={report} />

      {report.photos.length > 0 && (
        <ul className="grid grid-cols-2 gap-2 sm:grid-cols-3" aria-label="Photos">
          {report.photos.map((photo) => (
            <li key={photo.id}>
              <a href={photo.url} target="_blank" rel="noreferrer">
                <img src={photo.thumbUrl} alt={`Photo of ${reportTitle(report)}, ${report.season}`} width={photo.width} height={photo.height} className="aspect-[4/3] w-full rounded-lg object-cover" />
              </a>
            </li>
          ))}
        </ul>
      )}

      <div className="grid gap-6 md:grid-cols-[1fr_18rem]">
        <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-2 rounded-lg border border-fig-100 bg-white p-5 text-sm">
          {facts
            .filter(([, value]) => value)
            .map(([term, value]) => (
              <div key={term} className="contents">
                <dt className="text-ink/70">{term}</dt>
                <dd>{value}</dd>
              </div>
            ))}
          {report.notes && (
            <div className="contents">
              <dt className="text-ink/70">Notes</dt>
              <dd className="whitespace-pre-line">{report.notes}</dd>
            </div>
          )}
        </dl>
        <div className="flex flex-col gap-2">
          <Suspense fallback={<ReportMapSnippet lat={report.gridLat} lon={report.gridLon} />}>
            <MiniMap lat={report.gridLat} lon={report.gridLon} cell label="The report’s 5 km grid cell" className="h-52" />
          </Suspense>
          <p className="text-xs text-ink/70">
            {report.lat !== null ? `Exact place (only you${viewer.isOwner ? '' : ' as editor'} and editors see it): ${report.lat}, ${report.lon}. ` : ''}
            Others see this report in the 5 km grid cell around {report.gridLat}, {report.gridLon}.
          </p>
        </div>
      </div>

      <TreeTimeline report={report} />

      <section className="rounded-lg border border-fig-100 bg-white p-5">
        <h2 className="text-lg font-semibold text-fig-900">Nearby evidence for {reportTitle(report)}</h2>
        <div className="mt-2">
          <NearbyEvidence report={report} />
        </div>
      </section>

      <Actions report={report} />
      <p className="text-xs text-ink/70">
        Posted {units.date(report.createdAt)} · last changed {units.dateTime(report.updatedAt)}
      </p>
    </article>
  );
}

function StatusNotice({ report }: { report: Report }) {
  const publish = usePublishReport();
  if (report.status === 'draft') {
    return (
      <div role="status" className="rounded-md border border-amber-soft bg-amber-soft/30 px-4 py-3 text-sm">
        <p>
          <strong className="font-medium">Draft.</strong> Only you can see it. It will be published once your e-mail address is verified.
        </p>
        <Button variant="secondary" className="mt-2" disabled={publish.isPending} onClick={() => publish.mutate(report.id)}>
          Publish now
        </Button>
        {publish.error && <p className="mt-1 text-red-800">{publish.error.message}</p>}
      </div>
    );
  }
  if (report.status === 'hidden') {
    return (
      <div role="status" className="rounded-md border border-fig-200 bg-fig-50 px-4 py-3 text-sm">
        <strong className="font-medium">Hidden by an editor.</strong> Only you and the editors can see it.
        {report.hiddenReason && <p className="mt-1">Reason: {report.hiddenReason}</p>}
        {report.viewer.isOwner && <p className="mt-1 text-ink/70">You can correct the report; an editor can then restore it.</p>}
      </div>
    );
  }
  return null;
}

function Actions({ report }: { report: Report }) {
  const navigate = useNavigate();
  const remove = useDeleteReport();
  const { viewer } = report;
  const { user } = useCurrentUser();
  return (
    <div className="flex flex-col gap-4">
      {viewer.isOwner && (
        <div className="flex gap-2">
          <Link to={`/reports/${report.id}/edit`} className="rounded-md border border-fig-200 bg-white px-4 py-2 text-sm font-medium text-fig-700 hover:bg-fig-50">
            Edit
          </Link>
          <Button
            variant="danger"
            disabled={remove.isPending}
            onClick={() => window.confirm('Delete this report and its photos? This cannot be undone.') && remove.mutate(report.id, { onSuccess: () => navigate('/my/reports') })}
          >
            Delete
          </Button>
        </div>
      )}
      {!viewer.isOwner && report.status === 'published' &&
        (user ? (
          <FlagForm report={report} />
        ) : (
          <Link to={`/sign-in?next=${encodeURIComponent(`/reports/${report.id}`)}`} className="self-start text-sm text-fig-700 underline">
            Sign in to flag this report as doubtful
          </Link>
        ))}
      {viewer.canModerate && <ModerationForm report={report} />}
    </div>
  );
}

function ReasonForm({ label, hint, submit, pending, error, onSubmit }: { label: string; hint: string; submit: string; pending: boolean; error: Error | null; onSubmit: (reason: string) => void }) {
  const [reason, setReason] = useState('');
  const fieldError = error instanceof ApiError ? error.fields.reason?.[0] : undefined;
  return (
    <form
      className="flex flex-col gap-2 rounded-lg border border-fig-100 bg-white p-4"
      onSubmit={(e) => {
        e.preventDefault();
        onSubmit(reason);
      }}
    >
      <label className="text-sm font-medium" htmlFor={`reason-${submit}`}>
        {label}
      </label>
      <textarea id={`reason-${submit}`} rows={2} className={inputClass} value={reason} onChange={(e) => setReason(e.target.value)} />
      <p className="text-xs text-ink/70">{hint}</p>
      {error && <p role="alert" className="text-sm text-red-700">{fieldError ?? error.message}</p>}
      <Button type="submit" variant="secondary" className="self-start" disabled={pending}>
        {submit}
      </Button>
    </form>
  );
}

function FlagForm({ report }: { report: Report }) {
  const flag = useFlagReport();
  const [open, setOpen] = useState(false);
  if (report.viewer.hasOpenFlag || flag.isSuccess) return <p className="text-sm text-ink/70">You flagged this report; an editor will look at it.</p>;
  if (!open) {
    return (
      <button type="button" className="self-start text-sm text-fig-700 underline" onClick={() => setOpen(true)}>
        Flag as doubtful
      </button>
    );
  }
  return (
    <ReasonForm
      label="Why does this report look doubtful?"
      hint="Editors read every flag. Be specific, e.g. “ripe figs in April in a cold town”."
      submit="Send flag"
      pending={flag.isPending}
      error={flag.error}
      onSubmit={(reason) => flag.mutate({ id: report.id, reason })}
    />
  );
}

function ModerationForm({ report }: { report: Report }) {
  const hide = useHideReport();
  const restore = useRestoreReport();
  if (report.status === 'hidden') {
    return (
      <Button variant="secondary" className="self-start" disabled={restore.isPending} onClick={() => restore.mutate(report.id)}>
        Restore (editor)
      </Button>
    );
  }
  if (report.status !== 'published') return null;
  return (
    <div className="flex flex-col gap-1">
      {report.viewer.openFlags > 0 && <p className="text-sm text-fig-700">{report.viewer.openFlags} open flag(s) on this report.</p>}
      <ReasonForm
        label="Hide this report (editor)"
        hint="The grower sees your reason; the report leaves the atlas until restored. Recorded in the audit log."
        submit="Hide report"
        pending={hide.isPending}
        error={hide.error}
        onSubmit={(reason) => hide.mutate({ id: report.id, reason })}
      />
    </div>
  );
}
