import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import {
  MEMBERSHIP_TIERS,
  ONE_OFF_MAX_MAJOR,
  ONE_OFF_MIN_MAJOR,
  ONE_OFF_SUGGESTIONS_MAJOR,
  SUPPORT_CURRENCIES,
  TIER_DETAILS,
  currencyForLocale,
  formatMoney,
  type MembershipTier,
  type SupportCurrency,
  type SupportKind,
} from '@shared/domain/support';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { useCurrentUser } from '../../auth/api';
import { supportQueries, useStartCheckout } from '../api';

const CURRENCY_NAMES: Record<SupportCurrency, string> = { usd: 'US dollars', eur: 'Euros', gbp: 'Pounds sterling' };

const choiceClass = (selected: boolean) =>
  `flex cursor-pointer flex-col gap-1 rounded-lg border p-4 text-left transition-colors has-[:focus-visible]:outline has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-fig-500 ${
    selected ? 'border-fig-600 bg-fig-50 ring-1 ring-fig-600' : 'border-fig-100 bg-white hover:border-fig-300'
  }`;

/** The Support page's offer: a monthly membership at one of three levels, or a one-off gift, in the supporter's currency. */
export function SupportOffer({ returned }: { returned: boolean }) {
  const options = useQuery(supportQueries.options());
  const { user } = useCurrentUser();
  const start = useStartCheckout();
  const [kind, setKind] = useState<SupportKind>('monthly');
  const [currency, setCurrency] = useState<SupportCurrency>(() => currencyForLocale(typeof navigator === 'undefined' ? undefined : navigator.language));
  const [tier, setTier] = useState<MembershipTier>('sapling');
  const [amount, setAmount] = useState<string>('10');

  if (options.isLoading) return <p className="text-ink/70">Loading…</p>;
  if (!options.data?.enabled) {
    return (
      <p className="rounded-lg border border-fig-100 bg-white p-5 text-ink/80">
        Contributions are not set up on this installation of Syconium. Everything in the atlas stays open to you all the same.
      </p>
    );
  }

  const amountNumber = Number(amount);
  const amountError =
    kind === 'one-off' && !(Number.isInteger(amountNumber) && amountNumber >= ONE_OFF_MIN_MAJOR && amountNumber <= ONE_OFF_MAX_MAJOR)
      ? `Choose a whole amount from ${ONE_OFF_MIN_MAJOR} to ${ONE_OFF_MAX_MAJOR}.`
      : undefined;
  const serverError = start.error instanceof ApiError ? start.error : undefined;
  const needsAccount = kind === 'monthly' && !user;

  return (
    <form
      noValidate
      className="flex flex-col gap-6"
      onSubmit={(event) => {
        event.preventDefault();
        if (amountError || needsAccount) return;
        start.mutate(kind === 'monthly' ? { kind, tier, currency } : { kind, amount: amountNumber, currency });
      }}
    >
      {returned && (
        <p role="status" className="rounded-md bg-leaf-100 px-3 py-2 text-sm text-leaf-700">
          You came back from checkout without paying. Nothing was charged.
        </p>
      )}
      {options.data.testMode && (
        <p className="rounded-md border border-dashed border-fig-300 px-3 py-2 text-sm text-ink/80">
          Test mode: payments go to a local test provider and no real money moves. Pay with the card 4242 4242 4242 4242; 4000 0000 0000 0002 is declined.
        </p>
      )}

      <fieldset className="flex flex-col gap-2">
        <legend className="mb-2 font-semibold text-fig-900">How would you like to help?</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <label className={choiceClass(kind === 'monthly')}>
            <input type="radio" name="kind" value="monthly" className="sr-only" checked={kind === 'monthly'} onChange={() => setKind('monthly')} />
            <span className="font-medium">Every month</span>
            <span className="text-sm text-ink/80">A membership you can cancel from your account at any time.</span>
          </label>
          <label className={choiceClass(kind === 'one-off')}>
            <input type="radio" name="kind" value="one-off" className="sr-only" checked={kind === 'one-off'} onChange={() => setKind('one-off')} />
            <span className="font-medium">Once</span>
            <span className="text-sm text-ink/80">A single contribution; no account needed.</span>
          </label>
        </div>
      </fieldset>

      <label className="flex flex-col gap-1 text-sm font-medium sm:max-w-xs">
        Currency
        <select className="rounded-md border border-fig-200 bg-white px-3 py-2 font-normal" value={currency} onChange={(e) => setCurrency(e.target.value as SupportCurrency)}>
          {SUPPORT_CURRENCIES.map((c) => (
            <option key={c} value={c}>
              {CURRENCY_NAMES[c]} ({c.toUpperCase()})
            </option>
          ))}
        </select>
      </label>

      {kind === 'monthly' ? (
        <fieldset>
          <legend className="mb-2 font-semibold text-fig-900">Membership level</legend>
          <div className="grid gap-3 sm:grid-cols-3">
            {MEMBERSHIP_TIERS.map((t) => (
              <label key={t} className={choiceClass(tier === t)}>
                <input type="radio" name="tier" value={t} className="sr-only" checked={tier === t} onChange={() => setTier(t)} />
                <span className="font-medium">{TIER_DETAILS[t].label}</span>
                <span className="text-xl font-semibold text-fig-700">
                  {formatMoney(TIER_DETAILS[t].monthlyMinor[currency], currency)}
                  <span className="text-sm font-normal text-ink/70"> a month</span>
                </span>
                <span className="text-sm text-ink/80">{TIER_DETAILS[t].pitch}</span>
              </label>
            ))}
          </div>
          {needsAccount && (
            <p className="mt-3 rounded-md bg-fig-50 px-3 py-2 text-sm">
              A membership belongs to an account: <Link to="/sign-in" className="font-medium text-fig-700 underline">sign in</Link> or{' '}
              <Link to="/sign-up" className="font-medium text-fig-700 underline">join</Link> first, or give once instead.
            </p>
          )}
        </fieldset>
      ) : (
        <fieldset>
          <legend className="mb-2 font-semibold text-fig-900">Amount</legend>
          <div className="flex flex-wrap gap-2">
            {ONE_OFF_SUGGESTIONS_MAJOR.map((a) => (
              <label key={a} className={`${choiceClass(amount === String(a))} min-w-20 items-center px-4 py-2`}>
                <input type="radio" name="amount" value={a} className="sr-only" checked={amount === String(a)} onChange={() => setAmount(String(a))} />
                <span className="font-medium">{formatMoney(a * 100, currency)}</span>
              </label>
            ))}
          </div>
          <label className="mt-3 flex flex-col gap-1 text-sm font-medium sm:max-w-xs">
            Or another amount ({currency.toUpperCase()})
            <input
              type="text"
              inputMode="numeric"
              className="rounded-md border border-fig-200 px-3 py-2 font-normal"
              value={amount}
              aria-invalid={!!amountError}
              aria-describedby="amount-hint"
              onChange={(e) => setAmount(e.target.value.trim())}
            />
          </label>
          <p id="amount-hint" className={`mt-1 text-sm ${amountError ? 'text-red-700' : 'text-ink/70'}`}>
            {amountError ?? `Whole amounts from ${ONE_OFF_MIN_MAJOR} to ${ONE_OFF_MAX_MAJOR}.`}
          </p>
        </fieldset>
      )}

      {serverError && (
        <p role="alert" className="text-sm text-red-700">
          {serverError.message}
        </p>
      )}
      <div className="flex flex-col gap-2 sm:flex-row sm:items-center">
        <Button type="submit" disabled={start.isPending || !!amountError || needsAccount}>
          {start.isPending ? 'Opening the secure checkout…' : 'Continue to secure checkout'}
        </Button>
        <p className="text-sm text-ink/70">The payment provider takes your card on its own page; Syconium never sees it.</p>
      </div>
    </form>
  );
}
