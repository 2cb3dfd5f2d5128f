import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { passwordResetRequestSchema, type PasswordResetRequestInput } from '@shared/schemas/auth.schema';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { useRequestPasswordReset } from '../api/request-password-reset';
import { AuthLayout } from '../components/auth-layout';

/** Asks for a reset link; the answer is the same whether or not the address has an account. */
export function ForgotPasswordRoute() {
  const request = useRequestPasswordReset();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<PasswordResetRequestInput>({
    resolver: zodResolver(passwordResetRequestSchema),
    defaultValues: { email: '' },
  });

  return (
    <AuthLayout title="Forgot your password?">
      {request.isSuccess ? (
        <div className="space-y-4 text-sm text-granite-700" role="status">
          <p>{request.data.message}</p>
          <p>The link works once, for an hour. Check the spam folder if nothing arrives in a few minutes.</p>
          <Link className="font-medium text-glacier-700 underline" to={paths.login.href()}>
            Back to sign in
          </Link>
        </div>
      ) : (
        <form noValidate className="space-y-4" onSubmit={handleSubmit((values) => request.mutate(values))}>
          <p className="text-sm text-granite-700">
            Enter the e-mail address you sign in with. We send a link to choose a new password.
          </p>
          <TextField
            label="Email"
            type="email"
            autoComplete="username"
            autoFocus
            error={errors.email?.message}
            {...register('email')}
          />
          <FormError message={request.isError ? errorMessage(request.error) : null} />
          <Button type="submit" className="w-full" busy={request.isPending}>
            Send the link
          </Button>
          <p className="text-center text-sm">
            <Link className="text-glacier-700 underline" to={paths.login.href()}>
              Back to sign in
            </Link>
          </p>
        </form>
      )}
    </AuthLayout>
  );
}
