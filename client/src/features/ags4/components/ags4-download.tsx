import type { ApiErrorBody } from '@shared/schemas/common';
import { useState } from 'react';
import { Button } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { useCan } from '../../../lib/auth';

/** Where the API serves the AGS4 file of a location's or a project's tests. */
export const ags4Download = (of: 'location' | 'project', id: number) => `/api/${of === 'location' ? 'locations' : 'projects'}/${id}/ags4`;

/** The file name the server gave in Content-Disposition, or a plain one. */
const fileNameOf = (disposition: string | null) => /filename="?([^";]+)"?/.exec(disposition ?? '')?.[1] ?? 'plate-tests.ags';

/**
 * Downloads the tests of a location or project as one AGS4 file (staff only, as the API). The file is
 * fetched first, so that "no test has a record yet" shows here instead of being saved as a file.
 */
export function Ags4Download({ of, id }: { of: 'location' | 'project'; id: number }) {
  const canRead = useCan('plans:read');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | undefined>();
  if (!canRead) return null;
  const download = async () => {
    setBusy(true);
    setError(undefined);
    try {
      const response = await fetch(ags4Download(of, id), { credentials: 'same-origin' });
      if (!response.ok) {
        const body = (await response.json().catch(() => null)) as ApiErrorBody | null;
        setError(body?.error?.message ?? `The server answered ${response.status}.`);
        return;
      }
      const url = URL.createObjectURL(await response.blob());
      const link = document.createElement('a');
      link.href = url;
      link.download = fileNameOf(response.headers.get('content-disposition'));
      link.click();
      URL.revokeObjectURL(url);
    } catch {
      setError('Cannot reach the server. Check the connection and try again.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <>
      <Button
        type="button"
        variant="secondary"
        onClick={download}
        busy={busy}
        busyLabel="Writing AGS4…"
        title="The plate loading tests as an AGS4 file (PLTG/PLTT, edition 4.1.1)"
      >
        AGS4 file
      </Button>
      <FormError message={error} />
    </>
  );
}
