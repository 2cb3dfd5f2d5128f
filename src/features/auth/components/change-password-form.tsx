import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { changePasswordSchema, type ChangePasswordInput } from '@shared/schemas/auth.schema';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { fieldIssues, placeFieldIssues } from '@/lib/form-errors';
import { useChangePassword } from '../api/change-password';
import { NEW_PASSWORD_HINT } from './password-hint';

/** Change the signed-in member's password; the server says on which field a problem lies. */
export function ChangePasswordForm() {
  const change = useChangePassword();
  const toast = useToast();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<ChangePasswordInput>({
    resolver: zodResolver(changePasswordSchema),
    defaultValues: { currentPassword: '', newPassword: '' },
  });
  const placed = change.isError && fieldIssues(change.error).length > 0;

  return (
    <form
      noValidate
      className="max-w-md space-y-4"
      aria-label="Change password"
      onSubmit={handleSubmit((values) =>
        change.mutate(values, {
          onSuccess: () => {
            reset();
            toast.success('Password changed. Your other devices are signed out.');
          },
          onError: (error) => {
            placeFieldIssues(error, ['currentPassword', 'newPassword'] as const, setError);
          },
        }),
      )}
    >
      <TextField
        label="Current password"
        type="password"
        autoComplete="current-password"
        error={errors.currentPassword?.message}
        {...register('currentPassword')}
      />
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={NEW_PASSWORD_HINT}
        error={errors.newPassword?.message}
        {...register('newPassword')}
      />
      <FormError message={change.isError && !placed ? errorMessage(change.error) : null} />
      <Button type="submit" busy={change.isPending}>
        Change password
      </Button>
    </form>
  );
}
