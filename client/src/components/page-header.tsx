import type { ReactNode } from 'react';

/** Page title with an optional line above it (where we are) and actions beside it. */
export function PageHeader({ title, context, actions }: { title: string; context?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-5 flex flex-wrap items-end justify-between gap-3 border-b-2 border-neutral-300 pb-3">
      <div className="min-w-0">
        {context && <div className="text-neutral-800">{context}</div>}
        <h1 className="text-2xl font-bold break-words text-neutral-950 sm:text-3xl">{title}</h1>
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </header>
  );
}
