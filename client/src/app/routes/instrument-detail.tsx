import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, type LoaderFunctionArgs, useParams } from 'react-router-dom';
import { Button, LinkButton } from '../../components/button';
import { CalibrationBadge, KIND_LABELS } from '../../components/calibration-status';
import { FormNotice } from '../../components/form-alert';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { type InstrumentDetail, instrumentQueryOptions, useInstrument } from '../../features/instruments/api/get-instruments';
import { CalibrationForm } from '../../features/instruments/components/calibration-form';
import { CalibrationHistory } from '../../features/instruments/components/calibration-history';
import { requireRegisterAccess, useCanEditRegister } from '../../features/instruments/register-access';
import { formatRange } from '../../lib/instrument-text';
import { routeId } from '../route-guards';

export const instrumentLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRegisterAccess(queryClient, request);
    return queryClient.ensureQueryData(instrumentQueryOptions(routeId(params, 'instrumentId')));
  };

function InstrumentFacts({ instrument }: { instrument: InstrumentDetail }) {
  const overdue = instrument.status === 'overdue';
  return (
    <dl className="mb-8 grid max-w-3xl gap-x-6 gap-y-2 sm:grid-cols-[max-content_1fr]">
      <dt className="font-semibold">Kind</dt>
      <dd>{KIND_LABELS[instrument.kind]}</dd>
      <dt className="font-semibold">Range</dt>
      <dd className="font-mono">{formatRange(instrument)}</dd>
      <dt className="font-semibold">Resolution</dt>
      <dd className="font-mono">{instrument.resolution == null ? '—' : `${instrument.resolution} ${instrument.unit}`}</dd>
      {instrument.kind === 'gauge' && (
        <>
          <dt className="font-semibold">Stem travel</dt>
          <dd className="font-mono">{instrument.travelMm == null ? '—' : `${instrument.travelMm} mm`}</dd>
        </>
      )}
      {instrument.kind === 'jack' && (
        <>
          <dt className="font-semibold">Rated pressure</dt>
          <dd className="font-mono">{instrument.ratedPressureMpa == null ? 'not recorded' : `${instrument.ratedPressureMpa} MPa`}</dd>
        </>
      )}
      <dt className="font-semibold">Calibration</dt>
      <dd className="flex flex-wrap items-center gap-2">
        <CalibrationBadge status={instrument.status} />
        {instrument.current && (
          <span className={overdue ? 'font-bold text-alarm-900' : ''}>
            due <span className="font-mono">{instrument.current.dueOn}</span>
          </span>
        )}
      </dd>
      {instrument.notes && (
        <>
          <dt className="font-semibold">Notes</dt>
          <dd className="whitespace-pre-line">{instrument.notes}</dd>
        </>
      )}
    </dl>
  );
}

export function InstrumentDetailRoute() {
  const instrumentId = Number(useParams().instrumentId);
  const instrument = useInstrument(instrumentId);
  const canEdit = useCanEditRegister();
  const [recording, setRecording] = useState(false);
  const [recorded, setRecorded] = useState(false);
  return (
    <QueryResult query={instrument} loadingLabel="Loading instrument…">
      {(i) => (
        <>
          <PageHeader
            title={`${i.serialNumber} · ${i.makeModel}`}
            context={<Link to={paths.instruments.href()}>Instruments</Link>}
            actions={canEdit && <LinkButton to={paths.editInstrument.href(i.id)}>Edit instrument</LinkButton>}
          />
          <InstrumentFacts instrument={i} />
          <section aria-labelledby="calibrations-title" className="flex flex-col gap-4">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <h2 id="calibrations-title" className="text-xl font-bold">
                Calibrations
              </h2>
              {canEdit && !recording && (
                <Button
                  onClick={() => {
                    setRecorded(false);
                    setRecording(true);
                  }}
                >
                  Record calibration
                </Button>
              )}
            </div>
            {recorded && <FormNotice>Calibration recorded. Attach its certificate below.</FormNotice>}
            {recording && (
              <CalibrationForm
                instrumentId={i.id}
                instrumentKind={i.kind}
                onSaved={() => {
                  setRecording(false);
                  setRecorded(true);
                }}
                onCancel={() => setRecording(false)}
              />
            )}
            <CalibrationHistory calibrations={i.calibrations} canUpload={canEdit} />
          </section>
        </>
      )}
    </QueryResult>
  );
}
