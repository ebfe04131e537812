import { PHOTO_MAX_BYTES, PHOTO_TYPES, type PhotoKind, photoUploadFields } from '@shared/schemas/photos';
import { type ChangeEvent, type FormEvent, useId, useRef, useState } from 'react';
import { Button } from '../../../components/button';
import { FormError, FormNotice } from '../../../components/form-alert';
import { SelectField, TextField } from '../../../components/form-field';
import { useUploadPhoto } from '../api/upload-photo';
import { formatBytes, KIND_OPTIONS } from '../utils/photo-text';
import { photoCount, type QueuedPhoto, queueFiles, sendable, updateQueued, uploadProblem } from '../utils/upload-queue';

/** Options of {@link PhotoUpload}. */
export interface PhotoUploadProps {
  locationId: number;
  /** The run the photos belong to; omit for photos of the location itself. */
  runId?: number;
  /** Kind preselected in the form: 'site' on a location's page, 'pit' at a run. */
  defaultKind: PhotoKind;
}

const STATUS_WORDS: Record<QueuedPhoto['status'], string> = {
  ready: 'Ready to upload',
  sending: 'Uploading…',
  failed: 'Not uploaded',
  refused: 'Cannot be uploaded',
};

/** One chosen file: its name, size, and why it was not sent. */
function QueuedRow({ item, busy, onRemove }: { item: QueuedPhoto; busy: boolean; onRemove: () => void }) {
  const problem = item.status === 'failed' || item.status === 'refused';
  return (
    <li className={`flex flex-wrap items-center gap-x-3 gap-y-1 px-3 py-2 ${problem ? 'bg-alarm-50 text-alarm-900' : ''}`}>
      <span className="min-w-0 grow break-all font-semibold">{item.file.name}</span>
      <span className="font-mono text-sm">{formatBytes(item.file.size)}</span>
      <span className={problem ? 'font-semibold' : 'text-neutral-800'}>
        {problem && <span aria-hidden="true">✖ </span>}
        {STATUS_WORDS[item.status]}
        {item.reason && `: ${item.reason}`}
      </span>
      {item.status !== 'sending' && (
        <Button variant="quiet" disabled={busy} onClick={onRemove} aria-label={`Remove ${item.file.name} from the list`}>
          Remove
        </Button>
      )}
    </li>
  );
}

/**
 * Chooses site or pit photos and uploads them one request per file, one after the other. A file
 * refused here or by the server stays listed with the reason, to be removed or sent again.
 */
export function PhotoUpload({ locationId, runId, defaultKind }: PhotoUploadProps) {
  const inputId = useId();
  const hintId = `${inputId}-hint`;
  const upload = useUploadPhoto(locationId);
  const [kind, setKind] = useState<PhotoKind>(defaultKind);
  const [caption, setCaption] = useState('');
  const [captionProblem, setCaptionProblem] = useState<string>();
  const [queue, setQueue] = useState<QueuedPhoto[]>([]);
  const [progress, setProgress] = useState<{ n: number; total: number } | null>(null);
  const [outcome, setOutcome] = useState<{ sent: number; failed: number } | null>(null);
  const nextKey = useRef(0);
  const busy = progress !== null;
  const toSend = sendable(queue);

  const choose = (event: ChangeEvent<HTMLInputElement>) => {
    const files = Array.from(event.target.files ?? []);
    event.target.value = ''; // choosing the same file again should list it again
    if (files.length === 0) return;
    setOutcome(null);
    setQueue((q) => [...q, ...queueFiles(files, () => `f${nextKey.current++}`)]);
  };

  const send = async (event: FormEvent) => {
    event.preventDefault();
    const fields = photoUploadFields.safeParse({ kind, caption, runId });
    if (!fields.success) {
      setCaptionProblem(fields.error.issues.map((i) => i.message).join('; '));
      return;
    }
    setCaptionProblem(undefined);
    const batch = toSend;
    let sent = 0;
    // One after the other: a phone on a site connection does better with one upload at a time.
    for (const [i, item] of batch.entries()) {
      setProgress({ n: i + 1, total: batch.length });
      setQueue((q) => updateQueued(q, item.key, { status: 'sending', reason: null }));
      try {
        await upload.mutateAsync({ file: item.file, fields: fields.data });
        sent++;
        setQueue((q) => q.filter((x) => x.key !== item.key));
      } catch (error) {
        setQueue((q) => updateQueued(q, item.key, { status: 'failed', reason: uploadProblem(error) }));
      }
    }
    setProgress(null);
    setOutcome({ sent, failed: batch.length - sent });
    if (sent === batch.length) setCaption('');
  };

  return (
    <form onSubmit={send} noValidate aria-label="Add photos" className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-[minmax(12rem,18rem)_1fr]">
        <SelectField label="Kind" options={KIND_OPTIONS} value={kind} disabled={busy} onChange={(e) => setKind(e.target.value as PhotoKind)} />
        <TextField
          label="Caption (optional)"
          value={caption}
          maxLength={300}
          disabled={busy}
          error={captionProblem}
          hint="Given to each photo sent now; you can change it per photo afterwards."
          onChange={(e) => setCaption(e.target.value)}
        />
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={inputId} className="font-semibold">
          Choose photos
        </label>
        {/* No `capture`: on a phone people choose between the camera and photos already taken. */}
        <input
          id={inputId}
          type="file"
          multiple
          accept={PHOTO_TYPES.join(',')}
          aria-describedby={hintId}
          disabled={busy}
          onChange={choose}
          className="min-h-touch max-w-md rounded-md border-2 border-neutral-700 p-2 file:mr-3 file:min-h-9 file:rounded file:border-0 file:bg-neutral-900 file:px-3 file:font-semibold file:text-white"
        />
        <p id={hintId} className="text-sm text-neutral-700">
          JPEG, PNG or WebP, up to {PHOTO_MAX_BYTES / 1024 / 1024} MB each. You can choose several at once.
        </p>
      </div>
      {queue.length > 0 && (
        <ul aria-label="Chosen photos" className="divide-y divide-neutral-300 rounded-md border-2 border-neutral-300">
          {queue.map((item) => (
            <QueuedRow key={item.key} item={item} busy={busy} onRemove={() => setQueue((q) => q.filter((x) => x.key !== item.key))} />
          ))}
        </ul>
      )}
      <div aria-live="polite">
        {progress && (
          <p role="status" className="font-semibold">
            Uploading <span className="font-mono">{progress.n}</span> of <span className="font-mono">{progress.total}</span>
          </p>
        )}
        {!busy && outcome && outcome.sent > 0 && <FormNotice>{photoCount(outcome.sent)} added.</FormNotice>}
      </div>
      {!busy && outcome && outcome.failed > 0 && (
        <FormError message={`${photoCount(outcome.failed)} not uploaded: the reason stands beside each file. Press Upload to try again, or remove it.`} />
      )}
      {(toSend.length > 0 || busy) && (
        <div>
          <Button type="submit" busy={busy} busyLabel={progress ? `Uploading ${progress.n} of ${progress.total}…` : undefined}>
            Upload {photoCount(toSend.length)}
          </Button>
        </div>
      )}
    </form>
  );
}
