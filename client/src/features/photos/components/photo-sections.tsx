import { PHOTO_LIMIT_PER_LOCATION } from '@shared/schemas/photos';
import { useId } from 'react';
import { EmptyState, ErrorState, LoadingState, QueryResult } from '../../../components/query-states';
import { useLocationPhotos, useRunPhotos } from '../api/get-photos';
import { photoCount } from '../utils/upload-queue';
import { PhotoGallery } from './photo-gallery';
import { PhotoUpload } from './photo-upload';

/** The "Photos" section of a test location's page: every photo of the pit and its runs, and a way to add more. */
export function LocationPhotos({ locationId, pitId }: { locationId: number; pitId: string }) {
  const titleId = useId();
  const photos = useLocationPhotos(locationId);
  const full = (photos.data?.length ?? 0) >= PHOTO_LIMIT_PER_LOCATION;
  return (
    <section aria-labelledby={titleId} className="mt-8 flex flex-col gap-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={titleId} className="text-xl font-bold">
          Photos
        </h2>
        {photos.data && (
          <p className="text-neutral-800">
            <span className="font-mono">{photos.data.length}</span> of <span className="font-mono">{PHOTO_LIMIT_PER_LOCATION}</span> photos this location can
            hold
          </p>
        )}
      </div>
      <QueryResult query={photos} loadingLabel="Loading photos…">
        {(items) =>
          items.length === 0 ? (
            <EmptyState title="No photos yet">
              Add a view over the site, or of the pit with the plate and reaction in place, with “Choose photos” below. Photos taken during a test can also be
              added from the run’s console.
            </EmptyState>
          ) : (
            <PhotoGallery photos={items} label={`Photos of pit ${pitId}`} showOrigin />
          )
        }
      </QueryResult>
      <div className="rounded-md border-2 border-neutral-300 p-3">
        <h3 className="mb-2 text-lg font-bold">Add photos of this location</h3>
        {full ? (
          <p>This location holds the most photos it can ({PHOTO_LIMIT_PER_LOCATION}). Delete some to add others.</p>
        ) : (
          <PhotoUpload locationId={locationId} defaultKind="site" />
        )}
      </div>
    </section>
  );
}

/** Options of {@link PitPhotosPanel}. */
export interface PitPhotosPanelProps {
  runId: number;
  /** The run's test location, where its photos are kept; null while not yet known. */
  locationId: number | null;
  /** The run is signed: its photos can no longer change. */
  locked: boolean;
}

/** A folded panel on the run console: the photos the run's report will show, and pit photos to add to it. */
export function PitPhotosPanel({ runId, locationId, locked }: PitPhotosPanelProps) {
  const photos = useRunPhotos(runId);
  const count = photos.data ? ` (${photos.data.length})` : '';
  return (
    <section aria-label="Pit photos" className="mt-4">
      <details className="rounded-md border-2 border-neutral-300">
        <summary className="flex min-h-touch cursor-pointer items-center px-3 text-lg font-bold">
          Pit photos<span className="ml-1 font-mono font-normal">{count}</span>
        </summary>
        <div className="flex flex-col gap-4 border-t-2 border-neutral-300 p-3">
          {locked ? (
            <p>The run is signed, so its photos are locked. Reopen it on the review page to add or change photos.</p>
          ) : locationId === null ? (
            <LoadingState label="Finding the run’s test location…" />
          ) : (
            <PhotoUpload locationId={locationId} runId={runId} defaultKind="pit" />
          )}
          {photos.isPending && <LoadingState label="Loading photos…" />}
          {photos.isError && <ErrorState title="Could not load the photos" error={photos.error} onRetry={() => void photos.refetch()} />}
          {photos.data?.length === 0 && <p className="text-neutral-800">No photos for this run yet. Photos added here go on the run’s report.</p>}
          {photos.data && photos.data.length > 0 && <PhotoGallery photos={photos.data} label="Photos of this run" showOrigin currentRunId={runId} compact />}
        </div>
      </details>
    </section>
  );
}

/** Read-only: the photos the run's report will print, as the server picks them. */
export function ReportPhotos({ runId }: { runId: number }) {
  const titleId = useId();
  const photos = useRunPhotos(runId);
  return (
    <section aria-labelledby={titleId} className="mt-8 flex flex-col gap-3">
      <h2 id={titleId} className="text-xl font-bold">
        Photos on the report
      </h2>
      <QueryResult query={photos} loadingLabel="Loading photos…">
        {(items) =>
          items.length === 0 ? (
            <EmptyState title="The report will have no photos">
              Photos of the test location and of this run appear here. Add them on the location’s page or from the run’s console while the run is not signed.
            </EmptyState>
          ) : (
            <>
              <p className="text-neutral-800">{photoCount(items.length)} will appear on the report.</p>
              <PhotoGallery photos={items} label="Photos on the report" showOrigin currentRunId={runId} readOnly />
            </>
          )
        }
      </QueryResult>
    </section>
  );
}
