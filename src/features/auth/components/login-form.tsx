import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { zodResolver } from '@hookform/resolvers/zod';
import { loginSchema, type LoginInput } from '@shared/schemas/auth.schema';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { useLogin } from '../api/login';

export function LoginForm() {
  const loginMutation = useLogin();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<LoginInput>({ resolver: zodResolver(loginSchema), defaultValues: { email: '', password: '' } });

  return (
    <form noValidate className="space-y-4" onSubmit={handleSubmit((values) => loginMutation.mutate(values))}>
      <TextField
        label="Email"
        type="email"
        autoComplete="username"
        autoFocus
        error={errors.email?.message}
        {...register('email')}
      />
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...register('password')}
      />
      <FormError message={loginMutation.isError ? errorMessage(loginMutation.error) : null} />
      <Button type="submit" className="w-full" busy={loginMutation.isPending}>
        Sign in
      </Button>
      <p className="text-center text-sm">
        <Link className="text-glacier-700 underline" to={paths.forgotPassword.href()}>
          Forgot your password?
        </Link>
      </p>
    </form>
  );
}
