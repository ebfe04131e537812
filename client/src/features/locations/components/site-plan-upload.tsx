import { SITE_PLAN_TYPES, sitePlanFileProblem } from '@shared/schemas/projects';
import { type ChangeEvent, useId, useState } from 'react';
import { FormError, FormNotice } from '../../../components/form-alert';
import { useUploadSitePlan } from '../api/upload-site-plan';

/** Uploads (or replaces) a location's site-plan image: PNG or JPEG up to 10 MB. */
export function SitePlanUpload({ locationId, hasPlan }: { locationId: number; hasPlan: boolean }) {
  const inputId = useId();
  const upload = useUploadSitePlan(locationId);
  const [problem, setProblem] = useState<string | null>(null);

  const onChange = (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = ''; // choosing the same file again should upload again
    if (!file) return;
    const reason = sitePlanFileProblem(file);
    setProblem(reason);
    if (!reason) upload.mutate(file);
  };

  return (
    <div className="flex flex-col gap-2">
      <label htmlFor={inputId} className="font-semibold">
        {hasPlan ? 'Replace the site plan' : 'Upload a site plan'} <span className="font-normal text-neutral-800">(PNG or JPEG, up to 10 MB)</span>
      </label>
      <input
        id={inputId}
        type="file"
        accept={SITE_PLAN_TYPES.join(',')}
        onChange={onChange}
        disabled={upload.isPending}
        className="min-h-touch max-w-md rounded-md border-2 border-neutral-700 p-2 file:mr-3 file:min-h-9 file:rounded file:border-0 file:bg-neutral-900 file:px-3 file:font-semibold file:text-white"
      />
      {upload.isPending && <p role="status">Uploading…</p>}
      <FormError message={problem ?? upload.error?.message} />
      {upload.isSuccess && <FormNotice>Site plan saved. Edit the location to place the pin.</FormNotice>}
    </div>
  );
}
