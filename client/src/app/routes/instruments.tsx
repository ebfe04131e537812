import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { PageHeader } from '../../components/page-header';
import { EmptyState, QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { instrumentQueryOptions, instrumentsQueryOptions, useInstrument, useInstruments } from '../../features/instruments/api/get-instruments';
import { InstrumentForm } from '../../features/instruments/components/instrument-form';
import { InstrumentsTable } from '../../features/instruments/components/instruments-table';
import { requireRegisterAccess, useCanEditRegister } from '../../features/instruments/register-access';
import { routeId } from '../route-guards';

export const instrumentsLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRegisterAccess(queryClient, request);
    return queryClient.ensureQueryData(instrumentsQueryOptions());
  };

export const newInstrumentLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRegisterAccess(queryClient, request, true);
    return null;
  };

export const editInstrumentLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRegisterAccess(queryClient, request, true);
    return queryClient.ensureQueryData(instrumentQueryOptions(routeId(params, 'instrumentId')));
  };

export function InstrumentsRoute() {
  const instruments = useInstruments();
  const canEdit = useCanEditRegister();
  return (
    <>
      <PageHeader
        title="Instruments"
        actions={
          canEdit && (
            <LinkButton to={paths.newInstrument.href()} variant="primary">
              Register instrument
            </LinkButton>
          )
        }
      />
      <QueryResult query={instruments} loadingLabel="Loading the instrument register…">
        {(items) => (items.length === 0 ? <EmptyState title="No instruments registered yet" /> : <InstrumentsTable instruments={items} />)}
      </QueryResult>
    </>
  );
}

export function NewInstrumentRoute() {
  const navigate = useNavigate();
  return (
    <>
      <PageHeader title="Register instrument" context={<Link to={paths.instruments.href()}>Instruments</Link>} />
      <InstrumentForm onSaved={(i) => navigate(paths.instrument.href(i.id))} onCancel={() => navigate(-1)} />
    </>
  );
}

export function EditInstrumentRoute() {
  const navigate = useNavigate();
  const instrumentId = Number(useParams().instrumentId);
  const instrument = useInstrument(instrumentId);
  const back = () => navigate(paths.instrument.href(instrumentId));
  return (
    <QueryResult query={instrument} loadingLabel="Loading instrument…">
      {(i) => (
        <>
          <PageHeader title={`Edit ${i.serialNumber}`} context={<Link to={paths.instrument.href(i.id)}>{i.makeModel}</Link>} />
          <InstrumentForm instrument={i} onSaved={back} onCancel={back} />
        </>
      )}
    </QueryResult>
  );
}
