import { ACTIVE_PHASES, type RunCommand, type RunView } from '@shared/schemas/runs';
import { useState } from 'react';
import { Button } from '../../../components/button';
import { ReasonForm } from './command-button';

/** Who commands the run and who watches it, with "Take control" for anyone else while the run is open. */
export function ControlBar({
  view,
  userId,
  send,
  busy,
}: {
  view: RunView;
  userId: number | undefined;
  send: (c: RunCommand) => Promise<boolean>;
  busy: boolean;
}) {
  const mine = view.controller?.id === userId;
  return (
    <section aria-label="Control" className="flex flex-wrap items-center gap-3 rounded-md border-2 border-neutral-300 px-3 py-2">
      <p>
        <span className="font-semibold">In control:</span> {view.controller ? (mine ? `you (${view.controller.name})` : view.controller.name) : 'nobody yet'}
      </p>
      <p>
        <span className="font-semibold">Watching:</span> {view.watchers.length === 0 ? 'nobody' : view.watchers.map((w) => `${w.name} (${w.role})`).join(', ')}
      </p>
      {view.controller && !mine && ACTIVE_PHASES.includes(view.phase) && (
        <Button variant="secondary" busy={busy} onClick={() => void send({ type: 'take-control' })}>
          Take control
        </Button>
      )}
    </section>
  );
}

/** Stopping a run for good needs a reason on the record. */
export function StopRun({ send, busy, disabled }: { send: (c: RunCommand) => Promise<boolean>; busy: boolean; disabled: boolean }) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <Button variant="danger" className="self-start" disabled={disabled} onClick={() => setAsking(true)}>
        Stop run…
      </Button>
    );
  }
  return (
    <ReasonForm
      variant="danger"
      label="Why stop the run? It cannot be resumed."
      submitLabel="Stop the run"
      busy={busy}
      onCancel={() => setAsking(false)}
      onSubmit={(reason) => void send({ type: 'stop', reason })}
    />
  );
}
