import { zodResolver } from '@hookform/resolvers/zod';
import { type LoginInput, loginInput, type User } from '@shared/schemas/users';
import { useForm } from 'react-hook-form';
import { Button } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { useLogin } from '../api/login';

const FIELDS = ['email', 'password'] as const;

export function SignInForm({ onSignedIn }: { onSignedIn: (user: User) => void }) {
  const login = useLogin();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<LoginInput>({ resolver: zodResolver(loginInput, readableErrors), defaultValues: { email: '', password: '' } });

  const onSubmit = handleSubmit(withServerErrors(setError, FIELDS, async (input: LoginInput) => onSignedIn(await login.mutateAsync(input))));

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <FormError message={errors.root?.server?.message} />
      <TextField label="E-mail" type="email" autoComplete="username" inputMode="email" error={errors.email?.message} {...register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...register('password')} />
      <Button type="submit" busy={isSubmitting} busyLabel="Signing in…" className="w-full">
        Sign in
      </Button>
    </form>
  );
}
