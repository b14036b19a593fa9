import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { forgotInputSchema, type ForgotInput } from '@shared/schemas/email';
import { Button } from '../../../components/button';
import { FormField } from '../../../components/form-field';
import { useForgotPassword } from '../../email/api';

/** Ask for a reset link. The answer is the same whether or not the address has an account. */
export function ForgotPasswordForm() {
  const forgot = useForgotPassword();
  const form = useForm<ForgotInput>({ resolver: zodResolver(forgotInputSchema) });
  const { errors } = form.formState;

  if (forgot.isSuccess) {
    return (
      <p role="status" className="rounded-md bg-leaf-100 px-4 py-3 text-leaf-700">
        {forgot.data.message}
      </p>
    );
  }
  return (
    <form noValidate className="flex flex-col gap-4" onSubmit={form.handleSubmit((input) => forgot.mutate(input))}>
      <FormField
        label="E-mail"
        type="email"
        autoComplete="email"
        hint="The address you joined with. We send a link that lets you choose a new password."
        error={errors.email?.message}
        {...form.register('email')}
      />
      {forgot.error && (
        <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm text-red-800">
          {forgot.error.message}
        </p>
      )}
      <Button type="submit" disabled={forgot.isPending}>
        {forgot.isPending ? 'Sending…' : 'Send me a reset link'}
      </Button>
    </form>
  );
}
