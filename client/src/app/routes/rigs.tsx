import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { PageHeader } from '../../components/page-header';
import { EmptyState, QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { instrumentsQueryOptions, useInstruments } from '../../features/instruments/api/get-instruments';
import { requireRegisterAccess, useCanEditRegister } from '../../features/instruments/register-access';
import { deviceProfilesQueryOptions, rigQueryOptions, rigsQueryOptions, useDeviceProfiles, useRig, useRigs } from '../../features/rigs/api/get-rigs';
import { RigForm } from '../../features/rigs/components/rig-form';
import { RigsTable } from '../../features/rigs/components/rigs-table';
import { routeId } from '../route-guards';

export const rigsLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRegisterAccess(queryClient, request);
    return queryClient.ensureQueryData(rigsQueryOptions());
  };

/** The form needs the register and the device profiles; an edit also needs the rig. */
export const rigFormLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRegisterAccess(queryClient, request, true);
    await Promise.all([
      queryClient.ensureQueryData(instrumentsQueryOptions()),
      queryClient.ensureQueryData(deviceProfilesQueryOptions()),
      params.rigId === undefined ? null : queryClient.ensureQueryData(rigQueryOptions(routeId(params, 'rigId'))),
    ]);
    return null;
  };

export function RigsRoute() {
  const rigs = useRigs();
  const canEdit = useCanEditRegister();
  return (
    <>
      <PageHeader
        title="Rigs"
        actions={
          canEdit && (
            <>
              <LinkButton to={paths.deviceProfiles.href()}>Device profiles</LinkButton>
              <LinkButton to={paths.newRig.href()} variant="primary">
                New rig
              </LinkButton>
            </>
          )
        }
      />
      <QueryResult query={rigs} loadingLabel="Loading rigs…">
        {(items) => (items.length === 0 ? <EmptyState title="No rigs yet" /> : <RigsTable rigs={items} canEdit={canEdit} />)}
      </QueryResult>
    </>
  );
}

function RigFormPage({ rigId }: { rigId?: number }) {
  const navigate = useNavigate();
  const instruments = useInstruments();
  const profiles = useDeviceProfiles();
  const toList = () => navigate(paths.rigs.href());
  return (
    <QueryResult query={instruments} loadingLabel="Loading the instrument register…">
      {(register) => (
        <QueryResult query={profiles} loadingLabel="Loading device profiles…">
          {(deviceProfiles) =>
            rigId === undefined ? (
              <RigForm instruments={register} profiles={deviceProfiles} onSaved={toList} onCancel={toList} />
            ) : (
              <EditRigForm rigId={rigId} instruments={register} profiles={deviceProfiles} onDone={toList} />
            )
          }
        </QueryResult>
      )}
    </QueryResult>
  );
}

function EditRigForm({ rigId, onDone, ...lists }: { rigId: number; onDone: () => void } & Pick<Parameters<typeof RigForm>[0], 'instruments' | 'profiles'>) {
  const rig = useRig(rigId);
  return (
    <QueryResult query={rig} loadingLabel="Loading rig…">
      {(r) => <RigForm rig={r} {...lists} onSaved={onDone} onCancel={onDone} />}
    </QueryResult>
  );
}

export function NewRigRoute() {
  return (
    <>
      <PageHeader title="New rig" context={<Link to={paths.rigs.href()}>Rigs</Link>} />
      <RigFormPage />
    </>
  );
}

export function EditRigRoute() {
  const rigId = Number(useParams().rigId);
  return (
    <>
      <PageHeader
        title="Edit rig"
        context={<Link to={paths.rigs.href()}>Rigs</Link>}
        actions={<LinkButton to={paths.rigCheck.href(rigId)}>Check devices</LinkButton>}
      />
      <RigFormPage rigId={rigId} />
    </>
  );
}
