import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { acceptInvitationSchema, type AcceptInvitationInput } from '@shared/schemas/auth.schema';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { errorMessage } from '@/lib/api-client';
import { useAcceptInvitation } from '../api/accept-invitation';

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
        accept.mutate(values, { onError: () => onSubmitting(false) });
      })}
    >
      <TextField label="Email" value={email} readOnly disabled />
      <TextField label="Your name" autoComplete="name" error={errors.name?.message} {...register('name')} />
      <TextField
        label="Choose a password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. A phrase of three or four unrelated words is strong and easy to remember."
        error={errors.password?.message}
        {...register('password')}
      />
      <FormError message={accept.isError ? errorMessage(accept.error) : null} />
      <Button type="submit" className="w-full" busy={accept.isPending}>
        Join the club
      </Button>
    </form>
  );
}
