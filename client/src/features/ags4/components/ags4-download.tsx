import { buttonClass } from '../../../components/button';
import { useCan } from '../../../lib/auth';

/** Where the API serves the AGS4 file of a location's or a project's tests. */
export const ags4Download = (of: 'location' | 'project', id: number) => `/api/${of === 'location' ? 'locations' : 'projects'}/${id}/ags4`;

/** A link that downloads the tests of a location or project as one AGS4 file (staff only, as the API). */
export function Ags4Download({ of, id }: { of: 'location' | 'project'; id: number }) {
  const canRead = useCan('plans:read');
  if (!canRead) return null;
  return (
    <a className={buttonClass('secondary')} href={ags4Download(of, id)} download title="The plate loading tests as an AGS4 file (PLTG/PLTT, edition 4.1.1)">
      AGS4 file
    </a>
  );
}
