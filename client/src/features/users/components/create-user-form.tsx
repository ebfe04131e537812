import { zodResolver } from '@hookform/resolvers/zod';
import { type CreateUserInput, createUserInput, type Organization, type User } from '@shared/schemas/users';
import { useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { FormActions } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { SelectField, TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { emptyAsNull } from '../../../lib/form-values';
import { useCreateUser } from '../api/save-user';
import { ROLE_OPTIONS } from './role-labels';

const FIELDS = ['email', 'name', 'role', 'organizationId', 'password'] as const;

/** Adds an account with a first password the new user changes under My account. */
export function CreateUserForm({ organizations, onCreated }: { organizations: Organization[]; onCreated: (user: User) => void }) {
  const create = useCreateUser();
  const {
    register,
    control,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof createUserInput>, unknown, CreateUserInput>({
    resolver: zodResolver(createUserInput, readableErrors),
    defaultValues: { email: '', name: '', role: 'operator', organizationId: null, password: '' },
  });
  const role = useWatch({ control, name: 'role' });

  const onSubmit = handleSubmit(
    withServerErrors(setError, FIELDS, async (input: CreateUserInput) => {
      // Only a client belongs to an organisation; drop a choice left over from switching roles.
      const user = await create.mutateAsync({ ...input, organizationId: input.role === 'client' ? input.organizationId : null });
      reset();
      onCreated(user);
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <FormError message={errors.root?.server?.message} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
        <TextField label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register('email')} />
        <SelectField label="Role" options={ROLE_OPTIONS} error={errors.role?.message} {...register('role')} />
        {role === 'client' && (
          <SelectField
            label="Client organisation"
            placeholder="Choose…"
            options={organizations.map((o) => ({ value: String(o.id), label: o.name }))}
            error={errors.organizationId?.message}
            {...register('organizationId', emptyAsNull)}
          />
        )}
        <TextField
          label="First password"
          type="password"
          autoComplete="new-password"
          hint="8 to 128 characters; tell the user to change it."
          error={errors.password?.message}
          {...register('password')}
        />
      </div>
      <FormActions submitLabel="Add user" busyLabel="Adding…" busy={isSubmitting} />
    </form>
  );
}
