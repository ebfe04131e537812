import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useParams } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { requireRegisterAccess } from '../../features/instruments/register-access';
import { rigQueryOptions, useRig } from '../../features/rigs/api/get-rigs';
import { useRigLive } from '../../features/rigs/api/use-rig-live';
import { DeviceCheck } from '../../features/rigs/components/device-check';
import { routeId } from '../route-guards';

export const rigCheckLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRegisterAccess(queryClient, request);
    return queryClient.ensureQueryData(rigQueryOptions(routeId(params, 'rigId')));
  };

/** The live device check: every channel of the rig as the server reads it now. */
export function RigCheckRoute() {
  const rigId = Number(useParams().rigId);
  const rig = useRig(rigId);
  const feed = useRigLive(rigId);
  return (
    <QueryResult query={rig} loadingLabel="Loading rig…">
      {(r) => (
        <>
          <PageHeader title={`Device check: ${r.name}`} context={<Link to={paths.rigs.href()}>Rigs</Link>} />
          <DeviceCheck feed={feed} />
        </>
      )}
    </QueryResult>
  );
}
