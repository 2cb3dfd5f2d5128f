import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { acceptInvitationSchema, type AcceptInvitationInput } from '@shared/schemas/auth.schema';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { errorMessage } from '@/lib/api-client';
import { fieldIssues, placeFieldIssues } from '@/lib/form-errors';
import { useAcceptInvitation } from '../api/accept-invitation';
import { NEW_PASSWORD_HINT } from './password-hint';

interface AcceptInvitationFormProps {
  token: string;
  email: string;
  /** Called just before sending, so the page knows the sign-in that follows is this one. */
  onSubmitting: (pending: boolean) => void;
}

export function AcceptInvitationForm({ token, email, onSubmitting }: AcceptInvitationFormProps) {
  const accept = useAcceptInvitation();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<AcceptInvitationInput>({
    resolver: zodResolver(acceptInvitationSchema),
    defaultValues: { token, name: '', password: '' },
  });

  return (
    <form
      noValidate
      className="space-y-4"
      onSubmit={handleSubmit((values) => {
        onSubmitting(true);
        accept.mutate(values, {
          onError: (error) => {
            onSubmitting(false);
            // The server's reason (a password too easy to guess) goes beside the field it is about.
            placeFieldIssues(error, ['password', 'name'] as const, setError);
          },
        });
      })}
    >
      <TextField label="Email" value={email} readOnly disabled />
      <TextField label="Your name" autoComplete="name" error={errors.name?.message} {...register('name')} />
      <TextField
        label="Choose a password"
        type="password"
        autoComplete="new-password"
        hint={NEW_PASSWORD_HINT}
        error={errors.password?.message}
        {...register('password')}
      />
      <FormError
        message={accept.isError && fieldIssues(accept.error).length === 0 ? errorMessage(accept.error) : null}
      />
      <Button type="submit" className="w-full" busy={accept.isPending}>
        Join the club
      </Button>
    </form>
  );
}
