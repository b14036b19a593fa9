import { useQuery } from '@tanstack/react-query';
import { TIER_DETAILS, formatMoney } from '@shared/domain/support';
import { supportQueries } from '../api';

const monthName = (month: string) => new Intl.DateTimeFormat(undefined, { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${month}-01T00:00:00Z`));

/** Admins: money in per month and currency, and the members whose membership runs now. No card data exists to show. */
export function SupportersSummary() {
  const summary = useQuery(supportQueries.summary());
  if (summary.isLoading) return <p className="text-ink/70">Loading…</p>;
  if (summary.error) return <p role="alert" className="text-red-800">{summary.error.message}</p>;
  const { months, activeSupporters } = summary.data!;
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby="support-months">
        <h2 id="support-months" className="mb-2 text-lg font-semibold text-fig-900">
          Received per month
        </h2>
        {months.length === 0 ? (
          <p className="text-ink/70">Nothing received yet.</p>
        ) : (
          // Focusable, so the table can be scrolled by keyboard on a phone (axe: scrollable-region-focusable).
          <div className="overflow-x-auto rounded-lg border border-fig-100 bg-white" tabIndex={0} role="region" aria-labelledby="support-months">
            <table className="w-full text-sm">
              <thead className="bg-fig-50 text-left text-fig-900">
                <tr>
                  <th scope="col" className="px-3 py-2 font-semibold">Month</th>
                  <th scope="col" className="px-3 py-2 font-semibold">Currency</th>
                  <th scope="col" className="px-3 py-2 text-right font-semibold">Received</th>
                  <th scope="col" className="px-3 py-2 text-right font-semibold">Payments</th>
                </tr>
              </thead>
              <tbody>
                {months.map((m) => (
                  <tr key={`${m.month}-${m.currency}`} className="border-t border-fig-100">
                    <td className="px-3 py-2">{monthName(m.month)}</td>
                    <td className="px-3 py-2">{m.currency.toUpperCase()}</td>
                    <td className="px-3 py-2 text-right tabular-nums">{formatMoney(m.totalMinor, m.currency)}</td>
                    <td className="px-3 py-2 text-right tabular-nums">{m.contributions}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
      <section aria-labelledby="support-active">
        <h2 id="support-active" className="mb-2 text-lg font-semibold text-fig-900">
          Members now ({activeSupporters.length})
        </h2>
        {activeSupporters.length === 0 ? (
          <p className="text-ink/70">No running memberships.</p>
        ) : (
          <ul className="divide-y divide-fig-100 rounded-lg border border-fig-100 bg-white">
            {activeSupporters.map((s, i) => (
              <li key={i} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 px-4 py-2 text-sm">
                <span className="font-medium">{s.displayName}</span>
                <span className="text-ink/80">
                  {TIER_DETAILS[s.tier].label} · {formatMoney(s.amountMinor, s.currency)} a month · since {new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeZone: 'UTC' }).format(new Date(s.since))}
                  {s.status === 'past_due' && <span className="ml-2 rounded bg-red-100 px-1.5 text-red-800">payment due</span>}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
