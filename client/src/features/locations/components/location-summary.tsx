import type { TestLocation } from '@shared/schemas/projects';
import { formatNumber, Readout } from '../../../components/readout';
import { sitePlanUrl } from '../api/get-location';
import { SitePlanPin } from './site-plan-pin';

/** The recorded facts of a test location, numbers large enough to read beside the pit. */
export function LocationSummary({ location }: { location: TestLocation }) {
  const hasCoordinates = location.latitude != null && location.longitude != null;
  return (
    <div className="flex flex-col gap-4">
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
        <Readout label="Test depth" value={formatNumber(location.testDepthM)} unit="m" />
        <Readout label="Water table" value={formatNumber(location.waterTableDepthM)} unit={location.waterTableDepthM == null ? undefined : 'm'} />
        <Readout label="Pit width" value={formatNumber(location.pitWidthM)} unit={location.pitWidthM == null ? undefined : 'm'} />
      </div>
      <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[max-content_1fr]">
        <dt className="font-semibold">Coordinates</dt>
        <dd className="font-mono">{hasCoordinates ? `${location.latitude?.toFixed(6)}, ${location.longitude?.toFixed(6)}` : 'not recorded'}</dd>
        <dt className="font-semibold">Soil at test level</dt>
        <dd className="whitespace-pre-line">{location.soilDescription || 'not described'}</dd>
        {location.notes && (
          <>
            <dt className="font-semibold">Notes</dt>
            <dd className="whitespace-pre-line">{location.notes}</dd>
          </>
        )}
      </dl>
      {location.sitePlanFile && <SitePlanPin imageUrl={sitePlanUrl(location)} x={location.planX} y={location.planY} />}
    </div>
  );
}
