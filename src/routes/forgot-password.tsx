import { Link } from 'react-router';
import { Page } from '../components/page';
import { ForgotPasswordForm } from '../features/auth/components/forgot-password-form';

export default function ForgotPasswordRoute() {
  return (
    <Page title="Forgot your password?" intro="Tell us the address you joined with and we send you a link to choose a new one.">
      <ForgotPasswordForm />
      <p className="mt-6 text-sm text-ink/80">
        Remembered it?{' '}
        <Link className="font-medium text-fig-600 underline" to="/sign-in">
          Sign in
        </Link>
      </p>
    </Page>
  );
}
