import { useForm } from 'react-hook-form';
import { Link } from 'react-router';
import { DATA_LICENCE } from '@shared/domain/data-licence';
import { zodResolver } from '@hookform/resolvers/zod';
import { signUpInputSchema, type SignUpInput } from '@shared/schemas/auth';
import { Button } from '../../../components/button';
import { FormField } from '../../../components/form-field';
import { ApiError } from '../../../lib/api-client';
import { useSignUp } from '../api';

export function SignUpForm({ onSignedUp }: { onSignedUp: () => void }) {
  const signUp = useSignUp();
  const form = useForm<SignUpInput>({ resolver: zodResolver(signUpInputSchema) });
  const { errors } = form.formState;
  const serverFields = signUp.error instanceof ApiError ? signUp.error.fields : {};

  // Not signed in after joining: the address may already have an account. Say only what was sent.
  if (signUp.data && !signUp.data.user) {
    return (
      <div role="status" className="rounded-md border border-fig-200 bg-fig-50 px-4 py-3 text-sm text-ink">
        <p className="font-medium">Check your mailbox</p>
        <p className="mt-1">{signUp.data.message}</p>
        <p className="mt-2">
          <Link className="font-medium text-fig-600 underline" to="/sign-in">
            Sign in
          </Link>{' '}
          or{' '}
          <Link className="font-medium text-fig-600 underline" to="/forgot-password">
            choose a new password
          </Link>
          .
        </p>
      </div>
    );
  }

  return (
    <form noValidate className="flex flex-col gap-4" onSubmit={form.handleSubmit((input) => signUp.mutate(input, { onSuccess: ({ user }) => user && onSignedUp() }))}>
      <FormField
        label="Name shown with your reports"
        autoComplete="nickname"
        hint="Other growers see this name, never your e-mail."
        error={errors.displayName?.message ?? serverFields.displayName?.[0]}
        {...form.register('displayName')}
      />
      <FormField
        label="E-mail"
        type="email"
        autoComplete="email"
        hint="We send a link to confirm it; it is never shown with your reports."
        error={errors.email?.message ?? serverFields.email?.[0]}
        {...form.register('email')}
      />
      <FormField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. A short sentence is easy to remember."
        error={errors.password?.message ?? serverFields.password?.[0]}
        {...form.register('password')}
      />
      <div className="flex flex-col gap-1">
        <label className="flex items-start gap-2 text-sm">
          <input type="checkbox" className="mt-0.5 h-4 w-4 shrink-0 accent-fig-600" aria-invalid={errors.acceptDataLicence ? true : undefined} aria-describedby="licence-hint" {...form.register('acceptDataLicence')} />
          <span>
            I agree that my published reports are shared as open data under{' '}
            <a href={DATA_LICENCE.url} target="_blank" rel="license noreferrer" className="font-medium text-fig-700 underline">
              {DATA_LICENCE.title} ({DATA_LICENCE.name})
            </a>
            , credited to “{DATA_LICENCE.attribution}”.
          </span>
        </label>
        <p id="licence-hint" className="text-xs text-ink/70">
          Only the ~5 km grid cell of a report is ever shared, never your exact place, name or e-mail.{' '}
          <Link to="/about" className="underline">
            About the data
          </Link>
        </p>
        {(errors.acceptDataLicence?.message ?? serverFields.acceptDataLicence?.[0]) && (
          <p role="alert" className="text-sm text-red-700">
            {errors.acceptDataLicence?.message ?? serverFields.acceptDataLicence?.[0]}
          </p>
        )}
      </div>
      {signUp.error && !Object.keys(serverFields).length && (
        <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm text-red-800">
          {signUp.error.message}
        </p>
      )}
      <Button type="submit" disabled={signUp.isPending}>
        {signUp.isPending ? 'Creating your account…' : 'Create account'}
      </Button>
    </form>
  );
}
