import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { acceptInvitationSchema, type AcceptInvitationInput } from '@shared/schemas/auth.schema';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { errorMessage } from '@/lib/api-client';
import { useAcceptInvitation } from '../api/accept-invitation';

export function AcceptInvitationForm({ token, email }: { token: string; email: string }) {
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
    <form noValidate className="space-y-4" onSubmit={handleSubmit((values) => accept.mutate(values))}>
      <TextField label="Email" value={email} readOnly disabled />
      <TextField label="Your name" autoComplete="name" error={errors.name?.message} {...register('name')} />
      <TextField
        label="Choose a password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
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
