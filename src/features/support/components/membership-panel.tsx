import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { TIER_DETAILS, formatMoney, type MembershipStatus } from '@shared/domain/support';
import { Button } from '../../../components/button';
import { supportQueries, useCancelMembership, useSetSupporterMark } from '../api';

const STATUS_WORDS: Record<MembershipStatus, string> = {
  pending: 'Waiting for the first payment',
  active: 'Active',
  past_due: 'Payment due: the provider is retrying your card',
  cancelled: 'Cancelled',
};

const longDate = (iso: string) => new Intl.DateTimeFormat(undefined, { dateStyle: 'long', timeZone: 'UTC' }).format(new Date(iso));

/** My account → Membership: see it, show or hide the supporter mark, cancel it. */
export function MembershipPanel() {
  const mine = useQuery(supportQueries.membership());
  const cancel = useCancelMembership();
  const mark = useSetSupporterMark();
  const [confirming, setConfirming] = useState(false);

  if (mine.isLoading) return <p className="text-ink/70">Loading your membership…</p>;
  if (mine.error) return <p role="alert" className="text-red-800">{mine.error.message}</p>;
  const { membership, showMark } = mine.data!;
  const running = membership && (membership.status === 'active' || membership.status === 'past_due');

  return (
    <section id="membership" aria-labelledby="membership-heading" className="rounded-lg border border-fig-100 bg-white p-5">
      <h2 id="membership-heading" className="text-lg font-semibold text-fig-900">
        Membership
      </h2>
      {!membership ? (
        <p className="mt-1 text-sm text-ink/80">
          You are not a member. The atlas is open to all either way; if it has helped you, <Link to="/support" className="font-medium text-fig-700 underline">support it</Link>.
        </p>
      ) : (
        <>
          <dl className="mt-3 grid grid-cols-[max-content_1fr] gap-x-6 gap-y-2 text-sm">
            <dt className="text-ink/70">Level</dt>
            <dd>
              {TIER_DETAILS[membership.tier].label}, {formatMoney(membership.amountMinor, membership.currency)} a month
            </dd>
            <dt className="text-ink/70">State</dt>
            <dd className={membership.status === 'past_due' ? 'font-medium text-red-800' : ''}>{STATUS_WORDS[membership.status]}</dd>
            <dt className="text-ink/70">Since</dt>
            <dd>{longDate(membership.startedAt)}</dd>
            {membership.renewsOn && running && (
              <>
                <dt className="text-ink/70">Next payment</dt>
                <dd>{longDate(membership.renewsOn)}</dd>
              </>
            )}
            {membership.cancelledAt && (
              <>
                <dt className="text-ink/70">Cancelled on</dt>
                <dd>{longDate(membership.cancelledAt)}</dd>
              </>
            )}
          </dl>
          {!running && (
            <p className="mt-3 text-sm">
              <Link to="/support" className="font-medium text-fig-700 underline">
                Become a member again
              </Link>
            </p>
          )}
        </>
      )}

      <label className="mt-4 flex items-start gap-2 text-sm">
        <input type="checkbox" className="mt-0.5 h-4 w-4 accent-fig-600" checked={showMark} disabled={mark.isPending} onChange={(e) => mark.mutate(e.target.checked)} />
        <span>
          Show a supporter mark beside my name on my reports <span className="text-ink/70">(only while a membership runs; off unless you choose it)</span>
        </span>
      </label>

      {running && (
        <div className="mt-4 border-t border-fig-100 pt-4">
          {confirming ? (
            <div role="alertdialog" aria-labelledby="cancel-question" className="flex flex-col gap-3 rounded-md bg-fig-50 p-3">
              <p id="cancel-question" className="text-sm">
                Cancel your membership now? No further payments are taken. Nothing in the atlas changes for you.
              </p>
              <div className="flex gap-2">
                <Button variant="danger" disabled={cancel.isPending} onClick={() => cancel.mutate(undefined, { onSettled: () => setConfirming(false) })}>
                  {cancel.isPending ? 'Cancelling…' : 'Yes, cancel it'}
                </Button>
                <Button variant="secondary" onClick={() => setConfirming(false)}>
                  Keep it
                </Button>
              </div>
            </div>
          ) : (
            <Button variant="secondary" onClick={() => setConfirming(true)}>
              Cancel membership
            </Button>
          )}
          {cancel.error && (
            <p role="alert" className="mt-2 text-sm text-red-700">
              {cancel.error.message}
            </p>
          )}
        </div>
      )}
      {cancel.isSuccess && (
        <p role="status" className="mt-3 text-sm text-leaf-700">
          Your membership is cancelled. Thank you for the months you gave.
        </p>
      )}
    </section>
  );
}
