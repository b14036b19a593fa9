import { Link, useNavigate } from 'react-router';
import { Page } from '../components/page';
import { SignUpForm } from '../features/auth/components/sign-up-form';

export default function SignUpRoute() {
  const navigate = useNavigate();
  return (
    <Page
      title="Join Syconium"
      intro="Every season you report tells the growers near you which figs really ripen there. Your exact location stays yours: others see your reports on a coarse 5 km grid."
    >
      <SignUpForm onSignedUp={() => navigate('/account')} />
      <p className="mt-6 text-sm text-ink/80">
        Already have an account?{' '}
        <Link className="font-medium text-fig-600 underline" to="/sign-in">
          Sign in
        </Link>
      </p>
    </Page>
  );
}
