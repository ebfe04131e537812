import type { Project, TestLocation } from '@shared/schemas/projects';
import { type QueryKey, type UseQueryOptions, type UseQueryResult, useQuery } from '@tanstack/react-query';
import { type FormEvent, useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/button';
import { FormError, FormNotice } from '../../../components/form-alert';
import { FieldShell, SelectField, TextAreaField, TextField } from '../../../components/form-field';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { IMPORT_MAX_BYTES, ImportRejected, type ImportRequest, useImportRecord } from '../api/import-record';
import { ImportIssues } from './import-issues';

const FORMATS = [
  { value: 'csv', label: 'Readings CSV' },
  { value: 'json', label: 'Settlescope record (JSON)' },
];

/** Why a chosen file cannot be imported, or null. */
export function importFileProblem(file: Pick<File, 'name' | 'size'>): string | null {
  if (!/\.(json|csv)$/i.test(file.name)) return 'Choose a .json record or a .csv of readings.';
  if (file.size > IMPORT_MAX_BYTES) return 'The file is larger than 8 MB.';
  return null;
}

/**
 * Where an import can go: the projects, and the query of a project's test locations (the page composes
 * them from the locations feature, so the list shares that feature's cache key and refreshes with it).
 */
export interface ImportTargets<K extends QueryKey> {
  projects: UseQueryResult<Project[]>;
  locationsQuery: (projectId: number) => UseQueryOptions<TestLocation[], Error, TestLocation[], K>;
}

/** Imports a test recorded elsewhere into a chosen test location, as a completed run ready to interpret. */
export function ImportForm<K extends QueryKey>({ projects, locationsQuery }: ImportTargets<K>) {
  const [projectId, setProjectId] = useState('');
  const locations = useQuery({ ...locationsQuery(Number(projectId)), enabled: projectId !== '' });
  const [locationId, setLocationId] = useState('');
  const [source, setSource] = useState<'file' | 'paste'>('file');
  const [file, setFile] = useState<File | null>(null);
  const [format, setFormat] = useState('csv');
  const [content, setContent] = useState('');
  const [planName, setPlanName] = useState('');
  const [problems, setProblems] = useState<Record<string, string | undefined>>({});
  const submitImport = useImportRecord();

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found = {
      locationId: locationId ? undefined : 'Choose the test location the test belongs to.',
      file: source === 'file' ? (file ? (importFileProblem(file) ?? undefined) : 'Choose a file.') : undefined,
      content: source === 'paste' && !content.trim() ? 'Paste the record or the readings.' : undefined,
    };
    setProblems(found);
    if (Object.values(found).some(Boolean)) return;
    const common = { locationId: Number(locationId), ...(planName.trim() ? { planName: planName.trim() } : {}) };
    const request: ImportRequest = source === 'file' && file ? { ...common, file } : { ...common, format: format as 'json' | 'csv', content };
    submitImport.mutate(request);
  };

  const rejected = submitImport.error instanceof ImportRejected ? submitImport.error : null;
  const serverField = isApiError(submitImport.error) ? submitImport.error.field : undefined;
  const fieldError = (name: string) => problems[name] ?? (serverField === name ? submitImport.error?.message : undefined);

  return (
    <div className="flex flex-col gap-5">
      <form onSubmit={submit} aria-label="Import a test" className="flex max-w-3xl flex-col gap-4">
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            label="Project"
            placeholder="Choose…"
            value={projectId}
            onChange={(e) => {
              setProjectId(e.target.value);
              setLocationId('');
            }}
            options={(projects.data ?? []).map((p) => ({ value: String(p.id), label: `${p.code} ${p.name}` }))}
          />
          <SelectField
            label="Test location"
            placeholder={projectId ? 'Choose…' : 'Choose a project first'}
            value={locationId}
            disabled={!projectId}
            onChange={(e) => setLocationId(e.target.value)}
            error={fieldError('locationId')}
            options={(locations.data ?? []).map((l) => ({ value: String(l.id), label: `Pit ${l.pitId}` }))}
          />
        </div>
        <fieldset className="flex flex-wrap gap-4">
          <legend className="mb-1 font-semibold">The test comes as</legend>
          {(['file', 'paste'] as const).map((s) => (
            <label key={s} className="flex min-h-touch items-center gap-2">
              <input type="radio" name="import-source" value={s} checked={source === s} onChange={() => setSource(s)} />
              {s === 'file' ? 'A file (.json or .csv)' : 'Pasted text'}
            </label>
          ))}
        </fieldset>
        {source === 'file' ? (
          <FieldShell label="File" error={fieldError('file')} hint="A Settlescope record (.json) or a readings CSV (.csv), at most 8 MB.">
            {({ id, describedBy, invalid }) => (
              <input
                id={id}
                type="file"
                accept=".json,.csv"
                aria-describedby={describedBy}
                aria-invalid={invalid || undefined}
                onChange={(e) => setFile(e.target.files?.[0] ?? null)}
              />
            )}
          </FieldShell>
        ) : (
          <>
            <SelectField label="Format" value={format} onChange={(e) => setFormat(e.target.value)} options={FORMATS} error={fieldError('format')} />
            <TextAreaField
              label="Record or readings"
              rows={12}
              value={content}
              onChange={(e) => setContent(e.target.value)}
              error={fieldError('content')}
              className="font-mono"
            />
          </>
        )}
        <TextField
          label="Plan name"
          hint="Optional; by default “Imported test” with the pit and date of the record."
          value={planName}
          maxLength={160}
          onChange={(e) => setPlanName(e.target.value)}
        />
        <FormError message={submitImport.error && !rejected && !serverField ? submitImport.error.message : undefined} />
        <div>
          <Button type="submit" busy={submitImport.isPending} busyLabel="Importing…">
            Import
          </Button>
        </div>
      </form>
      {rejected && <ImportIssues message={rejected.message} issues={rejected.issues} omitted={rejected.omitted} />}
      {submitImport.isSuccess && (
        <FormNotice>
          Imported as run {submitImport.data.runId} ({submitImport.data.stages} stages, {submitImport.data.readings} readings), plan “
          {submitImport.data.planName}”. <Link to={paths.interpretation.href(submitImport.data.runId)}>Interpret it</Link>
        </FormNotice>
      )}
    </div>
  );
}
