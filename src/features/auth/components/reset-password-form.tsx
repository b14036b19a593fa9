import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { passwordSchema } from '@shared/schemas/auth';
import { Button } from '../../../components/button';
import { FormField } from '../../../components/form-field';
import { ApiError } from '../../../lib/api-client';
import { useResetPassword } from '../../email/api';

const newPasswordSchema = z.object({ password: passwordSchema });

/** Choose a new password with the token from the e-mailed link. */
export function ResetPasswordForm({ token, onReset }: { token: string; onReset: (message: string) => void }) {
  const reset = useResetPassword();
  const form = useForm<z.infer<typeof newPasswordSchema>>({ resolver: zodResolver(newPasswordSchema) });
  const { errors } = form.formState;
  const serverFields = reset.error instanceof ApiError ? reset.error.fields : {};

  return (
    <form noValidate className="flex flex-col gap-4" onSubmit={form.handleSubmit(({ password }) => reset.mutate({ token, password }, { onSuccess: (r) => onReset(r.message) }))}>
      <FormField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. Setting it signs your account out on every other device."
        error={errors.password?.message ?? serverFields.password?.[0]}
        {...form.register('password')}
      />
      {reset.error && !serverFields.password && (
        <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm text-red-800">
          {reset.error.message}
        </p>
      )}
      <Button type="submit" disabled={reset.isPending}>
        {reset.isPending ? 'Saving…' : 'Set my new password'}
      </Button>
    </form>
  );
}
