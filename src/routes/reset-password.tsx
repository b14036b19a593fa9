import { useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { Page } from '../components/page';
import { ResetPasswordForm } from '../features/auth/components/reset-password-form';

export default function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const [done, setDone] = useState<string | null>(null);
  return (
    <Page title="Choose a new password">
      {done ? (
        <div role="status" className="rounded-md bg-leaf-100 px-4 py-3 text-leaf-700">
          <p className="font-medium">{done}</p>
          <p className="mt-2">
            <Link to="/" className="underline">
              Go to the atlas
            </Link>
          </p>
        </div>
      ) : token ? (
        <ResetPasswordForm token={token} onReset={setDone} />
      ) : (
        <p>
          This page needs the whole link from the e-mail we sent you (part of it seems to be missing). Open it again from the message, or{' '}
          <Link to="/forgot-password" className="text-fig-600 underline">
            ask for a new one
          </Link>
          .
        </p>
      )}
    </Page>
  );
}
