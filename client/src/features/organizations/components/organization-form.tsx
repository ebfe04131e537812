import { zodResolver } from '@hookform/resolvers/zod';
import { type Organization, type OrganizationInput, organizationInput } from '@shared/schemas/users';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { FormActions } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { useSaveOrganization } from '../api/save-organization';

const FIELDS = ['name', 'contactEmails'] as const;

/** "a@x.org, b@y.org" or one per line → a list of addresses. */
const emailList = { setValueAs: (v: string | string[]) => (Array.isArray(v) ? v : v.split(/[\s,;]+/).filter(Boolean)) };

interface OrganizationFormProps {
  organization?: Organization;
  onSaved: (organization: Organization) => void;
  onCancel?: () => void;
}

/** A client organisation: its name and who receives its reports. */
export function OrganizationForm({ organization, onSaved, onCancel }: OrganizationFormProps) {
  const save = useSaveOrganization(organization?.id);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof organizationInput>, unknown, OrganizationInput>({
    resolver: zodResolver(organizationInput, readableErrors),
    defaultValues: { name: organization?.name ?? '', contactEmails: organization?.contactEmails ?? [] },
  });

  const onSubmit = handleSubmit(
    withServerErrors(setError, FIELDS, async (input: OrganizationInput) => {
      const saved = await save.mutateAsync(input);
      if (!organization) reset();
      onSaved(saved);
    }),
  );

  const emailError = errors.contactEmails?.message ?? errors.contactEmails?.find?.((e) => e?.message)?.message;
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      <FormError message={errors.root?.server?.message} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Organisation name" error={errors.name?.message} {...register('name')} />
        <TextField label="Report contacts" hint="E-mail addresses, separated by commas." error={emailError} {...register('contactEmails', emailList)} />
      </div>
      <FormActions submitLabel={organization ? 'Save' : 'Add organisation'} busy={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
