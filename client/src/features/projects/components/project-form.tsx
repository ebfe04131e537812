import { zodResolver } from '@hookform/resolvers/zod';
import type { Project, ProjectInput } from '@shared/schemas/projects';
import { projectInput } from '@shared/schemas/projects';
import type { Organization } from '@shared/schemas/users';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { FormActions } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { SelectField, TextAreaField, TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { emptyAsNull } from '../../../lib/form-values';
import { useSaveProject } from '../api/save-project';

const FIELDS = ['code', 'name', 'organizationId', 'site', 'address', 'notes'] as const;

function initialValues(project: Project | undefined): Partial<z.input<typeof projectInput>> {
  if (!project) return { code: '', name: '', site: '', address: '', notes: '' };
  const { code, name, organizationId, site, address, notes } = project;
  return { code, name, organizationId, site, address, notes };
}

interface ProjectFormProps {
  /** The project to edit; omit to create one. */
  project?: Project;
  /** Client organisations to choose from. */
  organizations: Organization[];
  onSaved: (project: Project) => void;
  onCancel?: () => void;
}

export function ProjectForm({ project, organizations, onSaved, onCancel }: ProjectFormProps) {
  const save = useSaveProject(project?.id);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof projectInput>, unknown, ProjectInput>({
    resolver: zodResolver(projectInput, readableErrors),
    defaultValues: initialValues(project),
  });

  const onSubmit = handleSubmit(withServerErrors(setError, FIELDS, async (input: ProjectInput) => onSaved(await save.mutateAsync(input))));

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-2xl flex-col gap-4">
      <FormError message={errors.root?.server?.message} />
      <div className="grid gap-4 sm:grid-cols-[12rem_1fr]">
        <TextField label="Project code" autoComplete="off" mono error={errors.code?.message} {...register('code')} />
        <TextField label="Project name" error={errors.name?.message} {...register('name')} />
      </div>
      <SelectField
        label="Client organisation"
        placeholder="Choose the client…"
        options={organizations.map((o) => ({ value: String(o.id), label: o.name }))}
        error={errors.organizationId?.message}
        hint={organizations.length === 0 ? 'No organisations yet: add the client under Organisations first.' : undefined}
        {...register('organizationId', emptyAsNull)}
      />
      <TextField label="Site" hint="The site's name as the client knows it." error={errors.site?.message} {...register('site')} />
      <TextAreaField label="Address" error={errors.address?.message} {...register('address')} />
      <TextAreaField label="Notes" error={errors.notes?.message} {...register('notes')} />
      <FormActions submitLabel={project ? 'Save changes' : 'Create project'} busy={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
