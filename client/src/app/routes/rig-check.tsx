import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { requireRegisterAccess } from '../../features/instruments/register-access';
import { rigQueryOptions, useRig } from '../../features/rigs/api/get-rigs';
import { useRigLive } from '../../features/rigs/api/use-rig-live';
import { DeviceCheck } from '../../features/rigs/components/device-check';
import { useUser } from '../../lib/auth';
import { can } from '../../lib/permissions';
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
  // A device no profile fits: an admin defines one and tries it on a port before the rig names it.
  const tryProfile = can(useUser()?.role, 'device-profiles:write') && <LinkButton to={paths.newDeviceProfile.href()}>Try a profile on a port</LinkButton>;
  return (
    <QueryResult query={rig} loadingLabel="Loading rig…">
      {(r) => (
        <>
          <PageHeader title={`Device check: ${r.name}`} context={<Link to={paths.rigs.href()}>Rigs</Link>} actions={tryProfile} />
          <DeviceCheck feed={feed} />
        </>
      )}
    </QueryResult>
  );
}
