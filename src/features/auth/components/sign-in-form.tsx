import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { signInInputSchema, type SignInInput } from '@shared/schemas/auth';
import { Button } from '../../../components/button';
import { FormField } from '../../../components/form-field';
import { useSignIn } from '../api';

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const signIn = useSignIn();
  const form = useForm<SignInInput>({ resolver: zodResolver(signInInputSchema) });
  const { errors } = form.formState;

  return (
    <form noValidate className="flex flex-col gap-4" onSubmit={form.handleSubmit((input) => signIn.mutate(input, { onSuccess: onSignedIn }))}>
      <FormField label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
      <FormField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...form.register('password')} />
      {signIn.error && (
        <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm text-red-800">
          {signIn.error.message}
        </p>
      )}
      <Button type="submit" disabled={signIn.isPending}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
