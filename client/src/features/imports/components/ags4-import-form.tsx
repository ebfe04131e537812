import { AGS4_MAX_BYTES } from '@shared/schemas/ags4';
import type { Project } from '@shared/schemas/projects';
import type { UseQueryResult } from '@tanstack/react-query';
import { type FormEvent, useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/button';
import { FormError, FormNotice } from '../../../components/form-alert';
import { FieldShell, SelectField } from '../../../components/form-field';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { useImportAgs4 } from '../api/import-ags4';
import { ImportRejected } from '../api/import-record';
import { ImportIssues } from './import-issues';

/** Why a chosen file cannot be sent as AGS4, or null. */
export function ags4FileProblem(file: Pick<File, 'name' | 'size'>): string | null {
  if (!/\.ags$/i.test(file.name)) return 'Choose an AGS4 file (.ags).';
  if (file.size > AGS4_MAX_BYTES) return 'The file is larger than 32 MB.';
  return null;
}

/** Imports the plate loading tests (PLTG/PLTT) of an AGS4 file into a project: each becomes a completed run. */
export function Ags4ImportForm({ projects }: { projects: UseQueryResult<Project[]> }) {
  const [projectId, setProjectId] = useState('');
  const [file, setFile] = useState<File | null>(null);
  const [problems, setProblems] = useState<Record<string, string | undefined>>({});
  const submitImport = useImportAgs4();

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found = {
      projectId: projectId ? undefined : 'Choose the project the tests belong to.',
      file: file ? (ags4FileProblem(file) ?? undefined) : 'Choose a file.',
    };
    setProblems(found);
    if (Object.values(found).some(Boolean) || !file) return;
    submitImport.mutate({ projectId: Number(projectId), file });
  };

  const rejected = submitImport.error instanceof ImportRejected ? submitImport.error : null;
  const serverField = isApiError(submitImport.error) ? submitImport.error.field : undefined;
  const fieldError = (name: string) => problems[name] ?? (serverField === name ? submitImport.error?.message : undefined);
  const done = submitImport.data;

  return (
    <div className="flex flex-col gap-5">
      <form onSubmit={submit} aria-label="Import an AGS4 file" className="flex max-w-3xl flex-col gap-4">
        <SelectField
          label="Project"
          placeholder="Choose…"
          value={projectId}
          onChange={(e) => setProjectId(e.target.value)}
          error={fieldError('projectId')}
          options={(projects.data ?? []).map((p) => ({ value: String(p.id), label: `${p.code} ${p.name}` }))}
        />
        <FieldShell
          label="AGS4 file"
          error={fieldError('file')}
          hint="An AGS4 file (.ags, at most 32 MB) with PLTG and PLTT groups. Each LOCA_ID goes to the project's test location with that pit id; a missing one is added."
        >
          {({ id, describedBy, invalid }) => (
            <input
              id={id}
              type="file"
              accept=".ags"
              aria-describedby={describedBy}
              aria-invalid={invalid || undefined}
              onChange={(e) => setFile(e.target.files?.[0] ?? null)}
            />
          )}
        </FieldShell>
        <FormError message={submitImport.error && !rejected && !serverField ? submitImport.error.message : undefined} />
        <div>
          <Button type="submit" busy={submitImport.isPending} busyLabel="Importing…">
            Import AGS4
          </Button>
        </div>
      </form>
      {rejected && <ImportIssues message={rejected.message} issues={rejected.issues} omitted={rejected.omitted} />}
      {done && (
        <FormNotice>
          <p>
            Imported {done.tests.length} {done.tests.length === 1 ? 'test' : 'tests'}
            {done.addedLocations.length > 0 && <>, adding the test locations {done.addedLocations.join(', ')}</>}.
          </p>
          <ul className="my-2 list-disc pl-6">
            {done.tests.map((t) => (
              <li key={t.runId}>
                Pit {t.pitId}, test {t.reference}: run {t.runId} ({t.stages} stages, {t.readings} readings).{' '}
                <Link to={paths.interpretation.href(t.runId)}>Interpret it</Link>
              </li>
            ))}
          </ul>
          {done.ignoredGroups.length > 0 && <p>Groups not read: {done.ignoredGroups.join(', ')}.</p>}
        </FormNotice>
      )}
    </div>
  );
}
