import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { Ags4ImportForm } from '../../features/imports/components/ags4-import-form';
import { ImportForm } from '../../features/imports/components/import-form';
import { locationsQueryOptions } from '../../features/locations/api/get-locations';
import { projectsQueryOptions, useProjects } from '../../features/projects/api/get-projects';
import { requirePermission } from '../route-guards';

export const importsLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'plans:write');
    return queryClient.ensureQueryData(projectsQueryOptions());
  };

/** Import of a test recorded elsewhere (a legacy paper test typed into a CSV, or a Settlescope record). */
export function ImportsRoute() {
  const projects = useProjects();
  return (
    <>
      <PageHeader title="Import a test" />
      <p className="mb-4 max-w-3xl text-neutral-800">
        A test recorded elsewhere becomes a completed run of the chosen location, with a plan that describes it, ready to interpret and report. The whole file
        is checked first: if anything is wrong, nothing is imported and every problem is listed with its line or field.
      </p>
      <ImportForm projects={projects} locationsQuery={locationsQueryOptions} />
      <section aria-labelledby="ags4-title" className="mt-10">
        <h2 id="ags4-title" className="mb-2 text-xl font-bold">
          From an AGS4 file
        </h2>
        <p className="mb-4 max-w-3xl text-neutral-800">
          The plate loading tests of an AGS4 file (groups PLTG and PLTT) become completed runs of a project. The file is checked against the AGS4 rules first;
          if anything is wrong, nothing is imported and every problem is listed with its line, group and heading. Other groups are not read and are listed.
        </p>
        <Ags4ImportForm projects={projects} />
      </section>
    </>
  );
}
