import { ACTIVE_PHASES, type RunCommand, type RunView } from '@shared/schemas/runs';
import { type ReactNode, useRef, useState } from 'react';
import { Button } from '../../../components/button';
import { CautionNotice } from '../../../components/caution-notice';
import { FormError } from '../../../components/form-alert';
import { useRunMode } from '../../../components/run-mode';
import { isApiError } from '../../../lib/api-client';
import { useUser } from '../../../lib/auth';
import { useRunEvents } from '../api/get-run-events';
import { useRunCommand } from '../api/send-run-command';
import { useNow } from '../utils/use-now';
import { useShortcuts } from '../utils/use-shortcuts';
import { useWakeLock } from '../utils/use-wake-lock';
import { AlarmsPanel } from './alarms-panel';
import { ControlBar, StopRun } from './control-bar';
import { GaugeResetDialog } from './gauge-reset-dialog';
import { HoldPanel } from './hold-panel';
import { ManualEntryPanel } from './manual-entry-panel';
import { EventsLog, NoteForm } from './notes-panel';
import { PreparingPanel } from './preparing-panel';
import { ReadingsPanel } from './readings-panel';
import { mainAction, RunBar } from './run-bar';
import { StepPanel, stageActions } from './step-panel';

interface RunConsoleProps {
  view: RunView;
  /** Local wall-clock time the view arrived, ms since the epoch: the data's age counts from it. */
  receivedAtMs: number | null;
  /** Takes a newer view (a command's answer, or a fresh copy after a refusal). */
  onView: (view: RunView) => void;
  /** The live link's state, shown in the header. */
  connection: ReactNode;
  /** The live plots. */
  charts: ReactNode;
}

/** Wall-clock seconds since the latest sample in the view was taken. */
function dataAgeSeconds(view: RunView, receivedAtMs: number | null, nowMs: number): number | null {
  if (view.live.atMs === null || receivedAtMs === null) return null;
  const runClockAge = (view.clock.nowMs - view.live.atMs) / Math.max(1, view.clock.speed);
  return (runClockAge + (nowMs - receivedAtMs)) / 1000;
}

function refusal(error: unknown): string | undefined {
  if (!error) return undefined;
  const message = (error instanceof Error ? error.message : String(error)).replace(/\.$/, '');
  return isApiError(error) && error.status === 409
    ? `Refused: ${message}. The console now shows the run as it stands; check it and decide again.`
    : `Refused: ${message}`;
}

/** The operator's console and the engineer's live view of one run. */
export function RunConsole({ view, receivedAtMs, onView, connection, charts }: RunConsoleProps) {
  const user = useUser();
  const latest = useRef(view);
  latest.current = view;
  const command = useRunCommand({ runId: view.id, version: () => latest.current.version, onView });
  const send = (c: RunCommand) =>
    command.mutateAsync(c).then(
      () => true,
      () => false,
    );
  const busy = command.isPending;
  const active = ACTIVE_PHASES.includes(view.phase);
  const disabled = !active || (view.controller !== null && view.controller.id !== user?.id);
  const actions = stageActions(view);
  const [askingEarly, setAskingEarly] = useState(false);
  const [askingFinish, setAskingFinish] = useState(false);
  const [resetting, setResetting] = useState(false);
  // The server takes a reset only while the load is held constant.
  const canReset = view.phase === 'holding' || view.phase === 'hold-met';
  const noteRef = useRef<HTMLTextAreaElement>(null);
  const events = useRunEvents(view.id, view.version);
  const now = useNow();
  useWakeLock(active);
  useRunMode(active);
  // From the log: until it has loaded, Start is offered and the server says if the gauges are not zeroed yet.
  const zeroed = events.data?.some((e) => e.kind === 'gauges-zeroed') ?? true;
  const startBlocked =
    view.overdueInstruments.length > 0 && !view.calibrationOverride
      ? 'Start waits for the overdue calibration to be accepted.'
      : zeroed
        ? null
        : 'Zero the gauges first.';
  const main = mainAction(view, actions, zeroed);

  const when = (ok: boolean, run: () => void) => (ok && !disabled && !busy ? run : null);
  useShortcuts({
    a: actions.applyNext ? when(true, () => void send({ type: 'advance' })) : when(actions.applyEarly, () => setAskingEarly(true)),
    t: when(actions.topUp, () => void send({ type: 'top-up' })),
    r: when(actions.stageReached, () => void send({ type: 'stage-reached' })),
    f: when(actions.finish, () => setAskingFinish(true)),
    n: active ? () => noteRef.current?.focus() : null,
  });

  return (
    <>
      <RunBar
        view={view}
        actions={actions}
        send={send}
        busy={busy}
        disabled={disabled}
        startBlocked={startBlocked}
        zeroed={zeroed}
        connection={connection}
        askingFinish={askingFinish}
        setAskingFinish={setAskingFinish}
      />
      <div aria-live="assertive">
        <FormError message={refusal(command.error)} />
      </div>
      {view.closedReason && <p className="mb-3 text-lg font-semibold">Closed: {view.closedReason}</p>}
      <ControlBar view={view} userId={user?.id} send={send} busy={busy} />
      {view.phase === 'preparing' && <PreparingPanel view={view} role={user?.role} send={send} busy={busy} disabled={disabled} zeroed={zeroed} />}
      {/* On a phone the step and the verdict come straight after the numbers; on a tablet they stand beside numbers and plots. */}
      <div className="mt-3 grid grid-cols-1 gap-4 lg:grid-cols-3">
        <div className="min-w-0 lg:col-span-2">
          <ReadingsPanel view={view} dataAgeS={dataAgeSeconds(view, receivedAtMs, now)} />
        </div>
        <div className="flex min-w-0 flex-col gap-4 lg:col-start-3 lg:row-span-2 lg:row-start-1">
          {active && view.phase !== 'preparing' && (
            <StepPanel
              view={view}
              actions={actions}
              send={send}
              busy={busy}
              disabled={disabled}
              askingEarly={askingEarly}
              setAskingEarly={setAskingEarly}
              main={main}
            />
          )}
          <HoldPanel hold={view.hold} />
          {view.manual && active && <ManualEntryPanel view={view} send={send} busy={busy} disabled={disabled} />}
        </div>
        <div className="min-w-0 lg:col-span-2">{charts}</div>
      </div>
      <div className="mt-4 grid grid-cols-1 gap-4 lg:grid-cols-2">
        <AlarmsPanel alarms={view.alarms} send={send} busy={busy} disabled={disabled} closed={!active} />
        <section aria-labelledby="log-heading" className="flex flex-col gap-3">
          <h2 id="log-heading" className="text-xl font-bold">
            Notes and log
          </h2>
          {active && <NoteForm send={send} busy={busy} disabled={!active} inputRef={noteRef} />}
          <EventsLog events={events.data} isPending={events.isPending} error={events.error} />
        </section>
      </div>
      {active && (
        <div className="mt-4 flex flex-col gap-3">
          {canReset && resetting && <GaugeResetDialog view={view} send={send} busy={busy} onClose={() => setResetting(false)} />}
          {canReset && !resetting && (
            <Button variant="secondary" className="self-start" disabled={disabled} onClick={() => setResetting(true)}>
              Reset a gauge…
            </Button>
          )}
          <StopRun send={send} busy={busy} disabled={disabled} />
        </div>
      )}
      <CautionNotice className="mt-6" />
    </>
  );
}
