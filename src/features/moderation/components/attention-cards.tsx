import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { moderationQueries } from '../api';

/** What needs an editor's attention now, each count linking to the tab that deals with it. */
export function AttentionCards() {
  const { data, error } = useQuery(moderationQueries.summary());
  if (error) return <p role="alert" className="text-sm text-red-700">{error.message}</p>;
  const cards = [
    { label: 'Open flags', value: data?.openFlags, to: '/editors/moderation?kind=flagged', hint: 'Reports growers flagged' },
    { label: 'Suspicious reports', value: data?.suspiciousReports, to: '/editors/moderation?kind=suspicious', hint: 'Picked out by the rules' },
    { label: 'Proposed names', value: data?.proposedVarieties, to: '/editors/varieties?status=proposed', hint: 'Waiting for review' },
    { label: 'Hidden reports', value: data?.hiddenReports, to: '/editors/moderation?kind=hidden', hint: 'Restore if hidden by mistake' },
    { label: 'Active wasp areas', value: data?.activeWaspAreas, to: '/editors/wasp-areas', hint: 'On the map and in the pollination check' },
  ];
  return (
    <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
      {cards.map((c) => (
        <li key={c.label}>
          <Link to={c.to} className="flex flex-col rounded-lg border border-fig-100 bg-white p-4 hover:border-fig-300 hover:shadow-sm">
            <span className="text-3xl font-semibold text-fig-700 tabular-nums">{c.value ?? '…'}</span>
            <span className="font-medium text-fig-900">{c.label}</span>
            <span className="text-xs text-ink/70">{c.hint}</span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
