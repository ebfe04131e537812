import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { deviceProfileQueryOptions, deviceProfilesQueryOptions, useDeviceProfile, useDeviceProfiles } from '../../features/rigs/api/get-rigs';
import { DeviceProfileForm } from '../../features/rigs/components/device-profile-form';
import { DeviceProfilesTable } from '../../features/rigs/components/device-profiles-table';
import { useUser } from '../../lib/auth';
import { can } from '../../lib/permissions';
import { requirePermission } from '../route-guards';

export const deviceProfilesLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'device-profiles:read');
    return queryClient.ensureQueryData(deviceProfilesQueryOptions());
  };

export const deviceProfileFormLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requirePermission(queryClient, request, 'device-profiles:write');
    if (params.profileId !== undefined) await queryClient.ensureQueryData(deviceProfileQueryOptions(params.profileId));
    return null;
  };

export function DeviceProfilesRoute() {
  const profiles = useDeviceProfiles();
  const canEdit = can(useUser()?.role, 'device-profiles:write');
  return (
    <>
      <PageHeader
        title="Device profiles"
        context={<Link to={paths.rigs.href()}>Rigs</Link>}
        actions={
          canEdit && (
            <LinkButton to={paths.newDeviceProfile.href()} variant="primary">
              New profile
            </LinkButton>
          )
        }
      />
      <p className="mb-4 max-w-3xl text-neutral-800">
        How each instrument on a serial port is read. The built-in profiles cannot change; a device they do not fit gets a lab profile, and its rig channel
        names it.
      </p>
      <QueryResult query={profiles} loadingLabel="Loading device profiles…">
        {(items) => <DeviceProfilesTable profiles={items} canEdit={canEdit} />}
      </QueryResult>
    </>
  );
}

export function NewDeviceProfileRoute() {
  const navigate = useNavigate();
  const toList = () => navigate(paths.deviceProfiles.href());
  return (
    <>
      <PageHeader title="New device profile" context={<Link to={paths.deviceProfiles.href()}>Device profiles</Link>} />
      <DeviceProfileForm onSaved={toList} onCancel={toList} />
    </>
  );
}

export function EditDeviceProfileRoute() {
  const navigate = useNavigate();
  const id = useParams().profileId ?? '';
  const profile = useDeviceProfile(id);
  const toList = () => navigate(paths.deviceProfiles.href());
  return (
    <>
      <PageHeader title="Edit device profile" context={<Link to={paths.deviceProfiles.href()}>Device profiles</Link>} />
      <QueryResult query={profile} loadingLabel="Loading the profile…">
        {(p) => <DeviceProfileForm profile={p} onSaved={toList} onCancel={toList} />}
      </QueryResult>
    </>
  );
}
