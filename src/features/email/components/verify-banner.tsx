import { Link } from 'react-router';
import { useCurrentUser } from '../../auth/api';
import { useResendVerification } from '../api';

/**
 * Shown to signed-in growers whose address is not confirmed yet: what that means for their reports
 * and a button to send the link again.
 */
export function VerifyBanner() {
  const { user } = useCurrentUser();
  const resend = useResendVerification();
  if (!user || user.emailVerified) return null;
  return (
    <div role="status" className="flex flex-wrap items-center gap-x-4 gap-y-2 border-b border-amber-soft bg-amber-soft/40 px-4 py-2 text-sm text-ink">
      <p className="flex-1">
        <span className="font-medium">Please confirm your e-mail address.</span> We sent a link to {user.email}. Until you follow it you can browse and
        save reports as drafts (listed in{' '}
        <Link to="/my/reports" className="underline">
          My reports
        </Link>
        ); they are published as soon as the address is confirmed.
      </p>
      {resend.isSuccess ? (
        <p className="text-leaf-700">{resend.data.message}</p>
      ) : (
        <button
          type="button"
          className="rounded-md border border-fig-200 bg-white px-3 py-1 font-medium text-fig-700 hover:bg-fig-50 disabled:opacity-60"
          disabled={resend.isPending}
          onClick={() => resend.mutate()}
        >
          {resend.isPending ? 'Sending…' : 'Send the link again'}
        </button>
      )}
      {resend.error && (
        <p role="alert" className="w-full text-red-800">
          {resend.error.message}
        </p>
      )}
    </div>
  );
}
