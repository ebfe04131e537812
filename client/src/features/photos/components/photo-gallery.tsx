import { type Photo, type PhotoKind, photoUrl } from '@shared/schemas/photos';
import { useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useUser } from '../../../lib/auth';
import { canChangePhoto } from '../photo-access';
import { describePhoto, KIND_WORDS, uploadedLine } from '../utils/photo-text';
import { PhotoDialog } from './photo-dialog';

/** Site and pit read differently without colour: the word carries it, the fill only helps. */
const KIND_TONE: Record<PhotoKind, string> = {
  site: 'border-neutral-700 bg-white text-neutral-950',
  pit: 'border-neutral-900 bg-neutral-900 text-white',
};

export function KindBadge({ kind }: { kind: PhotoKind }) {
  return <span className={`inline-flex items-center rounded-md border-2 px-2 py-0.5 text-sm font-semibold ${KIND_TONE[kind]}`}>{KIND_WORDS[kind]}</span>;
}

/** Whether a photo is of the location itself, of the run on screen, or of another run (linked). */
function PhotoOrigin({ photo, currentRunId }: { photo: Photo; currentRunId?: number }) {
  if (photo.runId === null) return <span className="text-sm text-neutral-800">Location</span>;
  if (photo.runId === currentRunId) return <span className="text-sm text-neutral-800">This run</span>;
  return (
    <Link to={paths.run.href(photo.runId)} className="text-sm font-semibold">
      Run <span className="font-mono">{photo.runId}</span>
    </Link>
  );
}

/** Options of {@link PhotoGallery}. */
export interface PhotoGalleryProps {
  photos: Photo[];
  /** Accessible name of the list, e.g. "Photos of pit TP-3". */
  label: string;
  /** Say on each photo whether it belongs to the location or to a run. Default false. */
  showOrigin?: boolean;
  /** The run on screen, named "This run" rather than linked. */
  currentRunId?: number;
  /** No caption edit and no delete, whoever looks (e.g. what a report shows). Default false. */
  readOnly?: boolean;
  /** Smaller tiles, for a panel beside live figures. Default false. */
  compact?: boolean;
}

/**
 * Thumbnails with caption, kind, uploader and time; each thumbnail is a button that opens the
 * photo larger, with its caption, the original file, and (when the user may) editing and deletion.
 */
export function PhotoGallery({ photos, label, showOrigin = false, currentRunId, readOnly = false, compact = false }: PhotoGalleryProps) {
  const user = useUser();
  const [openId, setOpenId] = useState<number | null>(null);
  const listRef = useRef<HTMLUListElement>(null);
  const opened = photos.find((p) => p.id === openId);
  const grid = compact ? 'grid-cols-3 sm:grid-cols-4 lg:grid-cols-6' : 'grid-cols-2 sm:grid-cols-3 lg:grid-cols-4';
  return (
    <>
      <ul ref={listRef} aria-label={label} tabIndex={-1} className={`grid gap-3 ${grid}`}>
        {photos.map((photo) => (
          <li key={photo.id} className="flex min-w-0 flex-col overflow-hidden rounded-md border-2 border-neutral-300">
            <button
              type="button"
              onClick={() => setOpenId(photo.id)}
              aria-label={`Open ${describePhoto(photo)}`}
              className="block aspect-[4/3] w-full bg-neutral-100 hover:opacity-90"
            >
              <img src={photoUrl(photo.id, 'thumb')} alt="" loading="lazy" className="h-full w-full object-cover" />
            </button>
            <div className="flex flex-col gap-1 p-2">
              <div className="flex flex-wrap items-center gap-2">
                <KindBadge kind={photo.kind} />
                {showOrigin && <PhotoOrigin photo={photo} currentRunId={currentRunId} />}
              </div>
              {compact ? (
                photo.caption && <p className="truncate text-sm">{photo.caption}</p>
              ) : (
                <>
                  <p className="line-clamp-3 break-words">{photo.caption || <span className="text-neutral-700">No caption</span>}</p>
                  <p className="text-sm text-neutral-800">{uploadedLine(photo)}</p>
                </>
              )}
            </div>
          </li>
        ))}
      </ul>
      {opened && (
        <PhotoDialog
          key={opened.id}
          photo={opened}
          editable={!readOnly && canChangePhoto(user, opened)}
          onClose={() => setOpenId(null)}
          onDeleted={() => {
            setOpenId(null);
            listRef.current?.focus(); // the thumbnail that had focus is gone
          }}
        />
      )}
    </>
  );
}
