import { Link, useNavigate, useSearchParams } from 'react-router';
import { Page } from '../components/page';
import { SignInForm } from '../features/auth/components/sign-in-form';

export default function SignInRoute() {
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = params.get('next');
  return (
    <Page title="Sign in" intro="Sign in to post your harvest reports and keep your trees’ history.">
      <SignInForm onSignedIn={() => navigate(next?.startsWith('/') ? next : '/')} />
      <p className="mt-4 text-sm">
        <Link className="text-fig-600 underline" to="/forgot-password">
          Forgot your password?
        </Link>
      </p>
      <p className="mt-6 text-sm text-ink/80">
        New here?{' '}
        <Link className="font-medium text-fig-600 underline" to="/sign-up">
          Create an account
        </Link>
      </p>
    </Page>
  );
}
