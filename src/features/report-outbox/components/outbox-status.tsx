import { useEffect, useState } from 'react';
import { retryRefused } from '../send';
import { dropReport, type OutboxReport } from '../store';
import { useOutbox } from '../use-outbox';

/** The report form's names for the fields a refusal may name. */
const FIELD_NAMES: Record<string, string> = {
  varietyId: 'Variety',
  proposedVarietyName: 'Proposed variety name',
  treeId: 'Tree',
  newTreeLabel: 'Label for the new tree',
  lat: 'Latitude',
  lon: 'Longitude',
  form: 'Grown',
  origin: 'Plant origin',
  yearPlanted: 'Year planted',
  season: 'Season year',
  crop: 'Crop',
  outcome: 'What the crop did',
  firstRipeDate: 'First ripe fig',
  lastHarvestDate: 'Last harvest',
  springFrostDate: 'Last spring frost',
  fallFrostDate: 'First fall frost',
  pinchedDate: 'Pinched on',
  notes: 'Notes',
};

function useOnline(): boolean {
  const [online, setOnline] = useState(() => navigator.onLine !== false);
  useEffect(() => {
    const update = () => setOnline(navigator.onLine !== false);
    window.addEventListener('online', update);
    window.addEventListener('offline', update);
    return () => {
      window.removeEventListener('online', update);
      window.removeEventListener('offline', update);
    };
  }, []);
  return online;
}

const describe = (report: OutboxReport) => `${report.values.newTreeLabel || 'Your report'}, season ${report.values.season}`;

/**
 * Reports kept on this phone, under the header on every page: how many wait for a connection, and
 * any the server refused, with what it said about each field (a refused report is not sent again
 * until the grower asks).
 */
export function OutboxStatus() {
  const { reports, send } = useOutbox();
  const online = useOnline();
  const waiting = reports.filter((r) => r.state === 'waiting');
  const refused = reports.filter((r) => r.state === 'refused');
  if (reports.length === 0) return null;
  const button = 'rounded-md border border-fig-200 bg-paper px-2 py-0.5 text-xs font-medium text-fig-800 hover:bg-fig-50';
  return (
    <section aria-label="Reports on this phone" className="border-b border-amber-soft bg-amber-soft/25 px-4 py-2 text-sm text-ink">
      {waiting.length > 0 && (
        <p role="status" className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <span>
            <strong>
              {waiting.length} {waiting.length === 1 ? 'report' : 'reports'} waiting to send
            </strong>
            {online ? '.' : ': kept on this phone, they go as soon as there is a connection.'}
          </span>
          {online && (
            <button type="button" className={button} onClick={send}>
              Send now
            </button>
          )}
        </p>
      )}
      {refused.map((report) => (
        <div key={report.clientId} role="alert" className="mt-1">
          <p>
            <strong>Not accepted: {describe(report)}.</strong> {Object.keys(report.refusal?.fields ?? {}).length ? 'The server said what to change:' : report.refusal?.message}
          </p>
          <ul className="ml-5 list-disc">
            {Object.entries(report.refusal?.fields ?? {}).map(([field, messages]) => (
              <li key={field}>
                {FIELD_NAMES[field] ?? field}: {messages.join('; ')}
              </li>
            ))}
          </ul>
          <p className="mt-1 flex gap-2">
            <button type="button" className={button} onClick={() => void retryRefused(report).catch(() => undefined)}>
              Try again
            </button>
            <button type="button" className={button} onClick={() => void dropReport(report.clientId)}>
              Discard it
            </button>
          </p>
        </div>
      ))}
    </section>
  );
}
