import { zodResolver } from '@hookform/resolvers/zod';
import { changePasswordInput, passwordSchema } from '@shared/schemas/users';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { FormActions } from '../../../components/button';
import { FormError, FormNotice } from '../../../components/form-alert';
import { TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { useChangePassword } from '../api/change-password';

/** The shared input plus a second typing of the new password, checked here only. */
const changePasswordForm = changePasswordInput
  .extend({ confirmPassword: passwordSchema })
  .refine((v) => v.newPassword === v.confirmPassword, { message: 'does not match the new password', path: ['confirmPassword'] });
type ChangePasswordForm = z.infer<typeof changePasswordForm>;

const FIELDS = ['currentPassword', 'newPassword', 'confirmPassword'] as const;

export function ChangePasswordForm() {
  const change = useChangePassword();
  const [saved, setSaved] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<ChangePasswordForm>({
    resolver: zodResolver(changePasswordForm, readableErrors),
    defaultValues: { currentPassword: '', newPassword: '', confirmPassword: '' },
  });

  const onSubmit = handleSubmit(
    withServerErrors(setError, FIELDS, async ({ currentPassword, newPassword }: ChangePasswordForm) => {
      setSaved(false);
      await change.mutateAsync({ currentPassword, newPassword });
      reset();
      setSaved(true);
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-md flex-col gap-4">
      <FormError message={errors.root?.server?.message} />
      {saved && <FormNotice>Password changed. Use the new one next time you sign in.</FormNotice>}
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
        hint="8 to 128 characters."
        error={errors.newPassword?.message}
        {...register('newPassword')}
      />
      <TextField
        label="New password again"
        type="password"
        autoComplete="new-password"
        error={errors.confirmPassword?.message}
        {...register('confirmPassword')}
      />
      <FormActions submitLabel="Change password" busyLabel="Changing…" busy={isSubmitting} />
    </form>
  );
}
