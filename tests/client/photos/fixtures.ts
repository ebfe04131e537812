import type { Photo } from '@shared/schemas/photos';
import { vi } from 'vitest';
import { aUser } from '../support/fixtures';

/* Invented photos of an invented pit, for the photo tests. */

export const OPERATOR = aUser('operator', 'Tomás Reyes', 'tomas.reyes@example.test'); // id 11
export const ENGINEER = aUser('engineer', 'Ines Okafor', 'ines.okafor@example.test');

export function aPhoto(fields: Partial<Photo> & Pick<Photo, 'id'>): Photo {
  return {
    locationId: 5,
    runId: null,
    kind: 'site',
    caption: '',
    width: 4032,
    height: 3024,
    mime: 'image/jpeg',
    bytes: 4_404_019,
    sha256: 'a'.repeat(64),
    uploadedBy: { id: 4, name: 'Pella Strand' },
    createdAt: '2026-03-04T09:15:00',
    ...fields,
  };
}

export const SITE_VIEW = aPhoto({ id: 31, caption: 'Looking north over the stripped platform' });
export const OWN_PIT = aPhoto({ id: 32, kind: 'pit', runId: 7, caption: 'Plate bedded on sand', uploadedBy: { id: OPERATOR.id, name: OPERATOR.name } });
export const OTHERS_PIT = aPhoto({ id: 33, kind: 'pit', runId: 8, caption: 'Kentledge blocks', uploadedBy: { id: 4, name: 'Pella Strand' } });

/** An image file of a given type and (claimed) size, without allocating the bytes. */
export function anImage(name: string, type: string, size = 2_000_000): File {
  const file = new File(['x'], name, { type });
  Object.defineProperty(file, 'size', { value: size });
  return file;
}

/*
 * jsdom has the <dialog> element but not its modal methods; these do what the page relies on:
 * the open attribute, and a close event when it closes.
 */
export function installDialogMethods() {
  const proto = HTMLDialogElement.prototype;
  if (!proto.showModal) {
    proto.showModal = vi.fn(function (this: HTMLDialogElement) {
      this.setAttribute('open', '');
    });
  }
  if (!proto.close) {
    proto.close = vi.fn(function (this: HTMLDialogElement) {
      if (!this.open) return;
      this.removeAttribute('open');
      this.dispatchEvent(new Event('close'));
    });
  }
}
