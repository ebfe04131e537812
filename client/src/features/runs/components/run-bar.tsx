import { type AlarmRecord, alarmKey } from '@shared/hold/alarm-lifecycle';
import type { HoldEvaluation } from '@shared/hold/verdict';
import { ACTIVE_PHASES, type RunCommand, type RunView } from '@shared/schemas/runs';
import { formatPlanned, formatValue } from '@shared/units/format';
import type { ReactNode } from 'react';
import { Button, LinkButton } from '../../../components/button';
import { paths } from '../../../config/paths';
import { formatCountdown, PHASE_LABELS, stageLabel } from '../utils/run-format';
import { useAlarmSignal } from '../utils/use-alarm-signal';
import { CommandButton } from './command-button';
import type { StageActions } from './step-panel';

/** Buttons sized for gloved hands: at least 60 px tall. */
const GLOVE = 'w-full';

/** The one thing the crew does next, by phase; the step panel offers everything else. */
export type MainAction = 'zero' | 'start' | 'stage-reached' | 'top-up' | 'apply-next' | 'finish' | null;

/** `zeroed`: the gauges have been zeroed (before that, zeroing is the next thing to do, unless a calibration blocks the start anyway). */
export function mainAction(view: RunView, actions: StageActions, zeroed = true): MainAction {
  if (view.phase === 'preparing') return zeroed || (view.overdueInstruments.length > 0 && !view.calibrationOverride) ? 'start' : 'zero';
  if (actions.applyNext) return 'apply-next';
  if (actions.finish) return 'finish';
  if (actions.stageReached) return 'stage-reached';
  if (view.phase === 'holding' && actions.topUp) return 'top-up';
  return null;
}

/** Minutes until the hold can be met, from what its rule judged; 0 once met, null when nothing can be said yet. */
export function holdMinutesLeft(hold: HoldEvaluation | null): number | null {
  if (!hold) return null;
  if (hold.verdict === 'satisfied') return 0;
  const e = hold.evidence;
  const floor = 'minHoldMin' in e ? Math.max(0, e.minHoldMin - e.heldMin) : 0;
  if (e.kind === 'fixed') return Math.max(0, e.remainingMin);
  if (hold.etaMin === null || !Number.isFinite(hold.etaMin)) return floor > 0 ? floor : null;
  return Math.max(floor, hold.etaMin);
}

function Figure({ label, value, emphasis = false }: { label: ReactNode; value: string; emphasis?: boolean }) {
  return (
    <div className={`flex min-w-0 flex-col rounded-md border-2 px-2 py-1 ${emphasis ? 'border-neutral-950' : 'border-neutral-400'}`}>
      <dt className="text-sm leading-tight font-semibold text-neutral-950">{label}</dt>
      <dd className="truncate font-mono text-[3rem] leading-none font-bold text-neutral-950">{value}</dd>
    </div>
  );
}

/** Critical alarms first, then the oldest: the one the banner names. */
function firstAlarm(alarms: AlarmRecord[]): AlarmRecord | undefined {
  return [...alarms].sort((a, b) => Number(b.alarm.severity === 'critical') - Number(a.alarm.severity === 'critical') || a.raisedAtMs - b.raisedAtMs)[0];
}

/** An alarm nobody has acknowledged, at once and in the operator's face, until someone does. */
function AlarmBanner({ alarms, send, busy, disabled }: { alarms: AlarmRecord[]; send: (c: RunCommand) => Promise<boolean>; busy: boolean; disabled: boolean }) {
  const standing = alarms.filter((a) => a.state === 'unacknowledged');
  useAlarmSignal(standing.map(alarmKey));
  const first = firstAlarm(standing);
  if (!first) return null;
  const critical = first.alarm.severity === 'critical';
  return (
    <div
      role="alert"
      data-testid="alarm-banner"
      className="flex flex-col gap-2 rounded-md border-4 border-alarm-900 bg-alarm-700 p-2 text-white sm:flex-row sm:items-center"
    >
      <p className="min-w-0 grow text-lg font-bold">
        <span aria-hidden="true">{critical ? '✖ ' : '⚠ '}</span>
        {critical ? 'Critical alarm' : 'Alarm'}: {first.alarm.message}
        {standing.length > 1 && <span className="font-normal"> (and {standing.length - 1} more below)</span>}
      </p>
      <Button
        variant="secondary"
        size="glove"
        className={`${GLOVE} shrink-0 sm:w-auto`}
        busy={busy}
        disabled={disabled}
        aria-label={`Acknowledge alarm: ${first.alarm.message}`}
        onClick={() => void send({ type: 'acknowledge-alarm', key: alarmKey(first) })}
      >
        Acknowledge
      </Button>
    </div>
  );
}

/** Finishing closes the run for good: asked once more, in place. */
function FinishAction({
  send,
  busy,
  disabled,
  asking,
  setAsking,
}: {
  send: (c: RunCommand) => Promise<boolean>;
  busy: boolean;
  disabled: boolean;
  asking: boolean;
  setAsking: (open: boolean) => void;
}) {
  if (!asking) {
    return (
      <CommandButton shortcut="F" size="glove" className={GLOVE} disabled={disabled} onClick={() => setAsking(true)}>
        Finish…
      </CommandButton>
    );
  }
  return (
    <fieldset className="flex flex-col gap-2">
      <legend className="font-semibold">Finish the test? The run closes and takes no more readings.</legend>
      <div className="grid grid-cols-2 gap-2">
        <Button size="glove" className={GLOVE} busy={busy} busyLabel="Finishing…" disabled={disabled} onClick={() => void send({ type: 'finish' })}>
          Yes, finish
        </Button>
        <Button variant="secondary" size="glove" className={GLOVE} onClick={() => setAsking(false)}>
          Keep going
        </Button>
      </div>
    </fieldset>
  );
}

interface RunBarProps {
  view: RunView;
  actions: StageActions;
  send: (c: RunCommand) => Promise<boolean>;
  busy: boolean;
  disabled: boolean;
  /** Start is refused until the gauges are zeroed and any overdue calibration accepted. */
  startBlocked: string | null;
  /** The gauges have been zeroed for this run. */
  zeroed: boolean;
  /** The live link's badge. */
  connection: ReactNode;
  /** The finish confirmation is open (Finish pressed, or F on the keyboard). */
  askingFinish: boolean;
  setAskingFinish: (open: boolean) => void;
}

/** The one main action for the phase, sized for gloves. */
function MainActionButton({ view, actions, send, busy, disabled, startBlocked, zeroed, askingFinish, setAskingFinish }: Omit<RunBarProps, 'connection'>) {
  switch (mainAction(view, actions, zeroed)) {
    case 'zero':
      return (
        <Button size="glove" className={GLOVE} busy={busy} disabled={disabled} onClick={() => void send({ type: 'zero' })}>
          Zero gauges
        </Button>
      );
    case 'start':
      return (
        <div className="flex flex-col gap-1">
          <Button size="glove" className={GLOVE} busy={busy} disabled={disabled || startBlocked !== null} onClick={() => void send({ type: 'start' })}>
            Start (seating)
          </Button>
          {startBlocked && <p className="text-sm font-semibold">{startBlocked}</p>}
        </div>
      );
    case 'apply-next':
      return (
        <CommandButton shortcut="A" size="glove" className={GLOVE} busy={busy} disabled={disabled} onClick={() => void send({ type: 'advance' })}>
          Apply next stage
        </CommandButton>
      );
    case 'finish':
      return <FinishAction send={send} busy={busy} disabled={disabled} asking={askingFinish} setAsking={setAskingFinish} />;
    case 'stage-reached':
      return (
        <CommandButton shortcut="R" size="glove" className={GLOVE} busy={busy} disabled={disabled} onClick={() => void send({ type: 'stage-reached' })}>
          Stage reached
        </CommandButton>
      );
    case 'top-up':
      return (
        <CommandButton
          shortcut="T"
          variant="secondary"
          size="glove"
          className={GLOVE}
          busy={busy}
          disabled={disabled}
          onClick={() => void send({ type: 'top-up' })}
        >
          Top up recorded
        </CommandButton>
      );
    default:
      return (
        <p role="status" className="flex min-h-[3.75rem] items-center rounded-md border-2 border-dashed border-neutral-700 px-3 text-lg font-semibold">
          {view.phase === 'pumping' ? 'Pump to the target: the hold starts by itself when it is reached.' : 'Nothing to do now.'}
        </p>
      );
  }
}

/** After the run: where its record goes next. */
function ClosedActions({ runId }: { runId: number }) {
  return (
    <nav aria-label="After the run" className="grid grid-cols-1 gap-2 sm:grid-cols-3">
      <LinkButton to={paths.replay.href(runId)} size="glove" className={GLOVE}>
        Replay the run
      </LinkButton>
      <LinkButton to={paths.interpretation.href(runId)} variant="primary" size="glove" className={GLOVE}>
        Interpret the results
      </LinkButton>
      <LinkButton to={paths.signoff.href(runId)} size="glove" className={GLOVE}>
        Submit for review
      </LinkButton>
    </nav>
  );
}

/**
 * The pinned bar of run mode: phase, stage n of N, actual against target, the gauge pressure to pump to,
 * the hold's countdown, the one main action and any standing alarm, all inside the first screen of a
 * phone, a portrait tablet and a landscape tablet.
 */
export function RunBar({ view, actions, send, busy, disabled, startBlocked, zeroed, connection, askingFinish, setAskingFinish }: RunBarProps) {
  const active = ACTIVE_PHASES.includes(view.phase);
  const stage = view.stages[view.stageIndex];
  const prompt = view.prompt;
  // Once the hold is met the prompt is the next stage's; a phone has room for "Pump to" only.
  const unit = prompt?.gaugeUnit ?? '';
  const pumpLabel =
    view.phase === 'hold-met' ? (
      <>
        <span className="max-sm:hidden">Next: pump to {unit}</span>
        <span className="sm:hidden">Pump to {unit}</span>
      </>
    ) : (
      `Pump to ${unit}`
    );
  const left = holdMinutesLeft(view.hold);
  return (
    <section aria-label="Run status" className="sticky top-0 z-20 -mx-4 mb-4 flex flex-col gap-2 border-b-4 border-neutral-950 bg-white px-4 py-2 shadow-md">
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <p className="shrink-0 rounded-md bg-neutral-950 px-3 py-1 text-lg font-bold text-white sm:text-xl">{PHASE_LABELS[view.phase]}</p>
        <div className="order-last min-w-0 basis-full sm:order-none sm:basis-0 sm:grow">
          <p className="truncate text-lg font-bold sm:text-xl">{stageLabel(stage, view.stages.length)}</p>
          <h1 className="truncate text-sm font-normal text-neutral-800">
            {view.planName} · run {view.id} · {view.rigName}
            {view.manual ? ' (readings by hand)' : ''}
          </h1>
        </div>
        <div className="ml-auto shrink-0">{connection}</div>
      </div>
      {active && <AlarmBanner alarms={view.alarms} send={send} busy={busy} disabled={disabled} />}
      {active ? (
        <div className="grid grid-cols-2 gap-2 md:grid-cols-4 lg:grid-cols-[repeat(4,minmax(0,1fr))_minmax(13rem,auto)]">
          <dl className="contents">
            <Figure label="Actual kPa" value={formatValue(view.live.pressureKpa, 'kPa')} emphasis />
            <Figure label="Target kPa" value={formatPlanned(stage?.targetKpa, 'kPa')} />
            <Figure label={pumpLabel} value={formatValue(prompt?.gaugePressure, prompt?.gaugeUnit)} />
            <Figure label="Hold: time left" value={formatCountdown(left)} />
          </dl>
          <div className="col-span-2 self-center md:col-span-4 lg:col-span-1">
            <MainActionButton
              view={view}
              actions={actions}
              send={send}
              busy={busy}
              disabled={disabled}
              startBlocked={startBlocked}
              zeroed={zeroed}
              askingFinish={askingFinish}
              setAskingFinish={setAskingFinish}
            />
          </div>
        </div>
      ) : (
        <ClosedActions runId={view.id} />
      )}
    </section>
  );
}
