import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { passwordResetCompleteSchema, type PasswordResetCompleteInput } from '@shared/schemas/auth.schema';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { errorMessage } from '@/lib/api-client';
import { fieldIssues, placeFieldIssues } from '@/lib/form-errors';
import { useCompletePasswordReset } from '../api/complete-password-reset';
import { NEW_PASSWORD_HINT } from './password-hint';

interface ResetPasswordFormProps {
  token: string;
  email: string;
  /** Called just before sending, so the page knows the sign-in that follows is this one. */
  onSubmitting: (pending: boolean) => void;
}

export function ResetPasswordForm({ token, email, onSubmitting }: ResetPasswordFormProps) {
  const complete = useCompletePasswordReset(token);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<PasswordResetCompleteInput>({
    resolver: zodResolver(passwordResetCompleteSchema),
    defaultValues: { password: '' },
  });
  const placed = complete.isError && fieldIssues(complete.error).length > 0;

  return (
    <form
      noValidate
      className="space-y-4"
      onSubmit={handleSubmit((values) => {
        onSubmitting(true);
        complete.mutate(values, {
          onError: (error) => {
            onSubmitting(false);
            placeFieldIssues(error, ['password'] as const, setError);
          },
        });
      })}
    >
      <TextField label="Email" value={email} readOnly disabled />
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={NEW_PASSWORD_HINT}
        error={errors.password?.message}
        {...register('password')}
      />
      <FormError message={complete.isError && !placed ? errorMessage(complete.error) : null} />
      <Button type="submit" className="w-full" busy={complete.isPending}>
        Set the new password
      </Button>
    </form>
  );
}
