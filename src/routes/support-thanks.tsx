import { useSearchParams } from 'react-router';
import { Page } from '../components/page';
import { CheckoutResult } from '../features/support/components/checkout-result';

export default function SupportThanksRoute() {
  const [params] = useSearchParams();
  const sessionId = params.get('session');
  return (
    <Page title="Thank you for supporting Syconium">
      {sessionId ? <CheckoutResult sessionId={sessionId} /> : <p className="text-ink/80">This page needs the checkout it came from.</p>}
    </Page>
  );
}
