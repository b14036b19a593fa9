import { photoListSchema, reportResponseSchema, type CreateReportValues } from '@shared/schemas/reports';
import { ApiError, apiFetch, uploadWithProgress } from '../../lib/api-client';
import { dropReport, keepReport, outboxReports, type OutboxReport } from './store';

export type SendOutcome =
  | { kind: 'sent'; id: number; notice?: string; photoError?: string }
  /** No connection (or the server is away): kept in the outbox, sent later. */
  | { kind: 'kept' }
  /** The server refused the report; the error names the fields. */
  | { kind: 'refused'; error: ApiError };

/** fetch() rejects with a TypeError when nothing answered; our uploads with status 0. */
const isUnreachable = (error: unknown) => error instanceof TypeError || (error instanceof ApiError && (error.status === 0 || error.status >= 500));

/** Send one kept report: the report (idempotent by clientId), then its photos; drop it once all is there. */
async function sendKept(report: OutboxReport, onProgress?: (share: number) => void): Promise<SendOutcome> {
  let id = report.reportId;
  let notice: string | undefined;
  try {
    if (id === undefined) {
      const answer = await apiFetch('/api/reports', reportResponseSchema, { method: 'POST', json: { ...report.values, clientId: report.clientId } });
      id = answer.report.id;
      notice = answer.notice;
      if (report.photos.length) await keepReport({ ...report, reportId: id });
    }
  } catch (error) {
    if (isUnreachable(error)) return { kind: 'kept' };
    if (error instanceof ApiError) return { kind: 'refused', error };
    throw error;
  }
  let photoError: string | undefined;
  if (report.photos.length) {
    const form = new FormData();
    for (const photo of report.photos) form.append('photos', new File([photo.blob], photo.name, { type: photo.type }));
    try {
      await uploadWithProgress(`/api/reports/${id}/photos`, form, photoListSchema, { onProgress: onProgress ?? (() => undefined) });
    } catch (error) {
      if (isUnreachable(error)) return { kind: 'kept' };
      photoError = `The report was saved, but the photos were not: ${error instanceof ApiError ? (Object.values(error.fields)[0]?.[0] ?? error.message) : 'the upload failed'}`;
    }
  }
  await dropReport(report.clientId);
  return { kind: 'sent', id, notice, photoError };
}

/**
 * The report form's submit for a new report: written to the outbox first, then sent at once when
 * there is a connection. A refusal takes it back out (the form shows the errors, as before); no
 * connection keeps it for `sendWaitingReports`.
 */
export async function submitNewReport(userId: number, values: CreateReportValues, files: File[], onProgress?: (share: number) => void): Promise<SendOutcome> {
  const report: OutboxReport = {
    clientId: crypto.randomUUID(),
    userId,
    values,
    photos: files.map((file) => ({ name: file.name, type: file.type, blob: file })),
    keptAt: new Date().toISOString(),
    state: 'waiting',
  };
  await keepReport(report);
  if (navigator.onLine === false) return { kind: 'kept' };
  const outcome = await sendKept(report, onProgress);
  if (outcome.kind === 'refused') await dropReport(report.clientId);
  return outcome;
}

let sending: Promise<void> | undefined;

/**
 * Send every waiting report, oldest first, stopping at the first that cannot reach the server.
 * One run at a time per tab, and (Web Locks) per browser: two tabs never send the same report at
 * once; should they anyway, the clientId keeps it to one copy on the server.
 */
export function sendWaitingReports(userId: number): Promise<void> {
  if (navigator.onLine === false) return Promise.resolve();
  sending ??= (async () => {
    const run = async () => {
      for (const report of await outboxReports()) {
        if (report.state !== 'waiting' || report.userId !== userId) continue;
        const outcome = await sendKept(report);
        if (outcome.kind === 'kept') return;
        if (outcome.kind === 'refused') {
          // Signed out: wait for the grower to sign in again rather than call it refused.
          if (outcome.error.status === 401 || outcome.error.status === 403) return;
          await keepReport({ ...report, state: 'refused', refusal: { message: outcome.error.message, fields: outcome.error.fields } });
        }
      }
    };
    await (navigator.locks ? navigator.locks.request('syconium-outbox', run) : run());
  })().finally(() => (sending = undefined));
  return sending;
}

/** A refused report back to `waiting` (after the grower read why), or gone. */
export async function retryRefused(report: OutboxReport, values?: CreateReportValues): Promise<void> {
  await keepReport({ ...report, values: values ?? report.values, state: 'waiting', refusal: undefined });
  await sendWaitingReports(report.userId);
}
