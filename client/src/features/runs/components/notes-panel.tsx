import { describeRunEvent } from '@shared/runs/event-text';
import type { RunCommand } from '@shared/schemas/runs';
import { type Ref, useState } from 'react';
import { FormActions } from '../../../components/button';
import { TextAreaField } from '../../../components/form-field';
import { ErrorState, LoadingState } from '../../../components/query-states';
import type { RunEvent } from '../api/get-run-events';
import { formatClock } from '../utils/run-format';

/** A note for the run's record; N on the keyboard puts the cursor here. */
export function NoteForm({
  send,
  busy,
  disabled,
  inputRef,
}: {
  send: (c: RunCommand) => Promise<boolean>;
  busy: boolean;
  disabled: boolean;
  inputRef: Ref<HTMLTextAreaElement>;
}) {
  const [text, setText] = useState('');
  const [weather, setWeather] = useState(false);
  return (
    <form
      aria-label="Add a note"
      className="flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (text.trim()) void send({ type: 'note', text: text.trim(), ...(weather ? { topic: 'weather' as const } : {}) }).then((ok) => ok && setText(''));
      }}
    >
      <TextAreaField ref={inputRef} label="Note (N)" value={text} onChange={(e) => setText(e.target.value)} maxLength={2000} disabled={disabled} />
      <label className="flex min-h-touch items-center gap-3">
        <input type="checkbox" className="size-6 accent-neutral-900" checked={weather} onChange={(e) => setWeather(e.target.checked)} disabled={disabled} />
        <span>About the weather (goes on the report’s weather line)</span>
      </label>
      <FormActions submitLabel="Add note" busyLabel="Adding…" busy={busy} />
    </form>
  );
}

/** Everything that happened in the run, newest first. */
export function EventsLog({ events, isPending, error }: { events: RunEvent[] | undefined; isPending: boolean; error: unknown }) {
  if (isPending) return <LoadingState label="Loading the log…" />;
  if (error) return <ErrorState title="Could not load the log" error={error} />;
  const items = [...(events ?? [])].reverse();
  return (
    <ol aria-label="Run log" className="max-h-96 overflow-y-auto rounded-md border-2 border-neutral-300">
      {items.length === 0 && <li className="p-3 text-neutral-800">Nothing recorded yet.</li>}
      {items.map((e) => {
        const words = describeRunEvent(e);
        return (
          <li key={e.id} className="flex flex-wrap gap-x-3 border-b border-neutral-300 px-3 py-2 last:border-b-0">
            <span className="font-mono text-neutral-800">{formatClock(e.atMs)}</span>
            <span className="font-semibold">{words.title}</span>
            {words.detail && <span>{words.detail}</span>}
          </li>
        );
      })}
    </ol>
  );
}
