import { Link, useSearchParams } from 'react-router';
import { Button } from '../components/button';
import { Page } from '../components/page';
import { useUnsubscribe } from '../features/email/api';

export default function UnsubscribeRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const unsubscribe = useUnsubscribe();
  return (
    <Page title="Unsubscribe from the nearby digest" intro="No need to sign in: the link in the message is enough.">
      {unsubscribe.isSuccess ? (
        <div role="status" className="rounded-md bg-leaf-100 px-4 py-3 text-leaf-700">
          <p className="font-medium">{unsubscribe.data.message}</p>
          <p className="mt-2">
            <Link to="/" className="underline">
              Back to the atlas
            </Link>
          </p>
        </div>
      ) : (
        <div className="flex flex-col items-start gap-4">
          <p>Stop the weekly e-mail about figs ripening near your home place?</p>
          <Button disabled={!token || unsubscribe.isPending} onClick={() => unsubscribe.mutate(token)}>
            {unsubscribe.isPending ? 'Unsubscribing…' : 'Unsubscribe'}
          </Button>
          {!token && <p className="text-sm text-ink/80">This page needs the whole link from the e-mail we sent you (part of it seems to be missing). Open it again from the message.</p>}
          {unsubscribe.error && (
            <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm text-red-800">
              {unsubscribe.error.message}
            </p>
          )}
        </div>
      )}
    </Page>
  );
}
