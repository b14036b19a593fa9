import { useEffect, useRef } from 'react';
import { Link, useSearchParams } from 'react-router';
import { Page } from '../components/page';
import { useVerifyEmail } from '../features/email/api';

export default function VerifyRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const verify = useVerifyEmail();
  const sent = useRef(false);
  useEffect(() => {
    // Once per page load, even under StrictMode's double effects: the link is single-use.
    if (token && !sent.current) {
      sent.current = true;
      verify.mutate(token);
    }
  }, [token, verify]);

  return (
    <Page title="Confirm your e-mail">
      {!token && <p>This page needs the whole link from the e-mail we sent you (part of it seems to be missing). Open it again from the message.</p>}
      {verify.isPending && <p className="text-ink/70">Confirming…</p>}
      {verify.isSuccess && (
        <div role="status" className="rounded-md bg-leaf-100 px-4 py-3 text-leaf-700">
          <p className="font-medium">{verify.data.message}</p>
          <p className="mt-2">
            <Link to="/my/reports" className="underline">
              My reports
            </Link>{' '}
            ·{' '}
            <Link to="/" className="underline">
              The atlas
            </Link>
          </p>
        </div>
      )}
      {verify.error && (
        <div role="alert" className="rounded-md bg-red-50 px-4 py-3 text-red-800">
          <p>{verify.error.message}</p>
          <p className="mt-2 text-sm">Signed in? The banner at the top of the page sends a fresh link.</p>
        </div>
      )}
    </Page>
  );
}
