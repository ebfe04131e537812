import { zodResolver } from '@hookform/resolvers/zod';
import { type Photo, type PhotoPatch, photoPatch, photoUrl } from '@shared/schemas/photos';
import { useEffect, useId, useRef } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Button, FormActions } from '../../../components/button';
import { ConfirmButton } from '../../../components/confirm-button';
import { FormError, FormNotice } from '../../../components/form-alert';
import { SelectField, TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { useDeletePhoto, usePatchPhoto } from '../api/change-photo';
import { describePhoto, formatBytes, KIND_OPTIONS, KIND_WORDS, typeWord, uploadedLine } from '../utils/photo-text';

const FIELDS = ['caption', 'kind'] as const;

function PhotoEditForm({ photo }: { photo: Photo }) {
  const patch = usePatchPhoto(photo.id);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof photoPatch>, unknown, PhotoPatch>({
    resolver: zodResolver(photoPatch, readableErrors),
    defaultValues: { caption: photo.caption, kind: photo.kind },
  });
  const onSubmit = handleSubmit(withServerErrors(setError, FIELDS, (input: PhotoPatch) => patch.mutateAsync(input)));
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Change the photo" className="flex flex-col gap-3">
      <FormError message={errors.root?.server?.message} />
      <div className="grid gap-3 sm:grid-cols-[minmax(12rem,18rem)_1fr]">
        <SelectField label="Kind" options={KIND_OPTIONS} error={errors.kind?.message} {...register('kind')} />
        <TextField label="Caption" maxLength={300} error={errors.caption?.message} {...register('caption')} />
      </div>
      <FormActions submitLabel="Save caption and kind" busy={isSubmitting} />
      {patch.isSuccess && <FormNotice>Saved.</FormNotice>}
    </form>
  );
}

function DeletePhoto({ photo, onDeleted }: { photo: Photo; onDeleted: () => void }) {
  const remove = useDeletePhoto(photo.id);
  return (
    <div className="flex flex-col gap-2">
      <ConfirmButton
        label="Delete photo"
        question="Delete this photo and its files for good?"
        busy={remove.isPending}
        onConfirm={() => remove.mutate(undefined, { onSuccess: onDeleted })}
      />
      <FormError message={remove.error?.message} />
    </div>
  );
}

interface PhotoDialogProps {
  photo: Photo;
  /** Offer the caption and kind form and deletion. */
  editable: boolean;
  /** Called once the dialog has closed (Close, or Escape). */
  onClose: () => void;
  onDeleted: () => void;
}

/**
 * One photo at preview size in a modal dialog: the browser's own dialog keeps focus inside, closes
 * on Escape and gives focus back to the thumbnail that opened it.
 */
export function PhotoDialog({ photo, editable, onClose, onDeleted }: PhotoDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal();
  }, []);
  const title = `${KIND_WORDS[photo.kind]} photo`;
  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onClose={onClose}
      className="m-auto max-h-[calc(100dvh-1rem)] w-[min(64rem,calc(100vw-1rem))] overflow-y-auto rounded-md border-2 border-neutral-950 bg-white p-0 text-neutral-950 backdrop:bg-neutral-950/70"
    >
      <div className="flex flex-col gap-4 p-4">
        <div className="flex items-center justify-between gap-3">
          <h2 id={titleId} className="text-xl font-bold">
            {title}
          </h2>
          <Button variant="secondary" onClick={() => ref.current?.close()}>
            Close
          </Button>
        </div>
        <img
          src={photoUrl(photo.id, 'preview')}
          alt={describePhoto(photo)}
          width={photo.width}
          height={photo.height}
          className="mx-auto block h-auto max-h-[65dvh] w-auto max-w-full bg-neutral-100 object-contain"
        />
        <div className="flex flex-col gap-1">
          <p className="text-lg break-words whitespace-pre-line">{photo.caption || <span className="text-neutral-700">No caption</span>}</p>
          <p className="text-neutral-800">{uploadedLine(photo)}</p>
          <p className="text-sm text-neutral-800">
            <span className="font-mono">
              {photo.width} × {photo.height}
            </span>{' '}
            px · {typeWord(photo.mime)} · <span className="font-mono">{formatBytes(photo.bytes)}</span>
          </p>
          <p>
            <a href={photoUrl(photo.id, 'original')} target="_blank" rel="noopener">
              Open the original file
            </a>
          </p>
        </div>
        {editable && (
          <div className="flex flex-col gap-4 border-t-2 border-neutral-300 pt-4">
            <PhotoEditForm photo={photo} />
            <DeletePhoto photo={photo} onDeleted={onDeleted} />
          </div>
        )}
      </div>
    </dialog>
  );
}
