import type { ReactNode } from 'react';

/** A form-level failure, e.g. a server message not tied to one field. Announced when it appears. */
export function FormError({ message }: { message: string | undefined }) {
  if (!message) return null;
  return (
    <div role="alert" className="rounded-md border-2 border-alarm-700 bg-alarm-50 p-3 font-semibold text-alarm-900">
      <span aria-hidden="true">✖ </span>
      {message}
    </div>
  );
}

/** A neutral confirmation (saved, sent); no colour, the wording carries it. */
export function FormNotice({ children }: { children: ReactNode }) {
  return (
    <div role="status" className="rounded-md border-2 border-neutral-700 bg-neutral-100 p-3 font-semibold text-neutral-950">
      <span aria-hidden="true">✓ </span>
      {children}
    </div>
  );
}
