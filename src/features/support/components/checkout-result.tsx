import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { formatMoney } from '@shared/domain/support';
import { supportQueries } from '../api';

/**
 * The page the provider sends the supporter back to. It reads our own records, which change only
 * when the provider's signed event arrives (before or after this page loads), and waits for it.
 */
export function CheckoutResult({ sessionId }: { sessionId: string }) {
  const status = useQuery(supportQueries.checkout(sessionId));
  if (status.isLoading) return <p className="text-ink/70">Looking up your payment…</p>;
  if (status.error) return <p role="alert" className="text-red-800">{status.error.message}</p>;
  const { state, kind, amountMinor, currency } = status.data!;
  const amount = formatMoney(amountMinor, currency);

  if (state === 'waiting') {
    return (
      <div role="status" className="flex items-center gap-3 rounded-lg border border-fig-100 bg-white p-5">
        <span aria-hidden className="h-4 w-4 animate-spin rounded-full border-2 border-fig-300 border-t-fig-600" />
        <p>Waiting for the payment provider to confirm your {kind === 'monthly' ? 'membership' : 'contribution'} of {amount}… This usually takes a few seconds.</p>
      </div>
    );
  }
  if (state === 'unpaid') {
    return (
      <p role="status" className="rounded-lg border border-fig-100 bg-white p-5">
        This checkout ended without a payment; nothing was charged. <Link to="/support" className="font-medium text-fig-700 underline">Try again</Link>
      </p>
    );
  }
  return (
    <div role="status" className="flex flex-col gap-3 rounded-lg border border-leaf-300 bg-leaf-100 p-5 text-leaf-700">
      <p className="text-lg font-semibold">Thank you: {kind === 'monthly' ? `your membership of ${amount} a month is active.` : `your contribution of ${amount} has arrived.`}</p>
      <p className="text-ink/80">A receipt is on its way by e-mail. Every page, number and download of the atlas stays open to everyone, as it always will.</p>
      {kind === 'monthly' && (
        <p>
          <Link to="/account#membership" className="font-medium text-fig-700 underline">
            See your membership
          </Link>
        </p>
      )}
    </div>
  );
}
