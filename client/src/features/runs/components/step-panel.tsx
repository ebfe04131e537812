import type { NextStepPrompt } from '@shared/hold/next-step';
import type { RunCommand, RunView } from '@shared/schemas/runs';
import { formatNumber } from '../../../components/readout';
import { BRANCH_LABELS } from '../utils/run-format';
import { CommandButton, ReasonForm } from './command-button';

/** Which of the stage actions apply to a run as it stands. */
export function stageActions(view: RunView) {
  const { phase } = view;
  const isLast = view.stageIndex >= view.stages.length - 1;
  const holding = phase === 'holding' || phase === 'hold-met';
  return {
    applyNext: phase === 'hold-met' && !isLast,
    applyEarly: phase === 'holding' && !isLast,
    finish: phase === 'hold-met' && isLast, // the server finishes only once the last hold is met
    stageReached: phase === 'pumping' && (view.manual || view.live.pressureKpa === null),
    topUp: holding || phase === 'pumping',
  };
}

export type StageActions = ReturnType<typeof stageActions>;

function PromptFigures({ prompt }: { prompt: NextStepPrompt }) {
  return (
    <dl className="grid grid-cols-1 gap-2 sm:grid-cols-3 lg:grid-cols-1">
      <div className="rounded-md border-2 border-neutral-300 p-2">
        <dt className="text-sm font-semibold text-neutral-800">Target pressure</dt>
        <dd className="font-mono text-3xl font-bold">
          {prompt.targetKpa} <span className="text-base font-normal">kPa</span>
        </dd>
      </div>
      <div className="rounded-md border-2 border-neutral-300 p-2">
        <dt className="text-sm font-semibold text-neutral-800">Plate force</dt>
        <dd className="font-mono text-3xl font-bold">
          {formatNumber(prompt.plateForceKn, 1)} <span className="text-base font-normal">kN</span>
        </dd>
      </div>
      <div className="rounded-md border-2 border-neutral-950 p-2">
        <dt className="text-sm font-semibold text-neutral-800">Pump the jack gauge to</dt>
        <dd className="font-mono text-3xl font-bold">
          {formatNumber(prompt.gaugePressure, 1)} <span className="text-base font-normal">{prompt.gaugeUnit}</span>
        </dd>
      </div>
    </dl>
  );
}

interface StepPanelProps {
  view: RunView;
  actions: StageActions;
  /** Sends a command; resolves true when the server accepted it. */
  send: (command: RunCommand) => Promise<boolean>;
  busy: boolean;
  disabled: boolean;
  /** The early-advance reason form is open (A pressed before the hold is met). */
  askingEarly: boolean;
  setAskingEarly: (open: boolean) => void;
}

/** What to apply next and the one-touch actions of the stage. */
export function StepPanel({ view, actions, send, busy, disabled, askingEarly, setAskingEarly }: StepPanelProps) {
  const { prompt } = view;
  const pumping = view.phase === 'pumping' || view.phase === 'preparing';
  return (
    <section aria-labelledby="step-heading" className="flex flex-col gap-3 rounded-md border-2 border-neutral-800 p-3">
      <h2 id="step-heading" className="text-xl font-bold">
        {pumping ? 'Pump to this stage' : 'Next step'}
      </h2>
      {prompt ? (
        <>
          <p className="font-semibold">
            Stage {prompt.stageIndex + 1} of {view.stages.length} · {BRANCH_LABELS[prompt.branch]}
            {view.phase === 'holding' && ' — once the hold is met'}
          </p>
          <PromptFigures prompt={prompt} />
          {prompt.problem && (
            <p role="alert" className="rounded-md border-2 border-alarm-700 bg-alarm-50 p-2 font-semibold text-alarm-900">
              <span aria-hidden="true">✖ </span>
              {prompt.problem}
            </p>
          )}
          <p className="rounded-md border-2 border-caution-700 bg-caution-50 p-2 text-caution-950">
            <span aria-hidden="true">⚠ </span>
            Hydraulic pressure and the reaction load are hazards: keep hands and heads clear of the jack, hose and reaction while pumping.
          </p>
        </>
      ) : (
        <p className="text-neutral-800">{actions.finish ? 'This is the last stage: finish the run once the hold is met.' : 'No further stage is planned.'}</p>
      )}
      <div className="flex flex-wrap gap-2">
        {actions.applyNext && (
          <CommandButton shortcut="A" className="text-lg" busy={busy} disabled={disabled} onClick={() => void send({ type: 'advance' })}>
            Apply next stage
          </CommandButton>
        )}
        {actions.applyEarly && !askingEarly && (
          <CommandButton shortcut="A" variant="secondary" disabled={disabled} onClick={() => setAskingEarly(true)}>
            Apply next stage early…
          </CommandButton>
        )}
        {actions.stageReached && (
          <CommandButton shortcut="R" busy={busy} disabled={disabled} onClick={() => void send({ type: 'stage-reached' })}>
            Stage reached
          </CommandButton>
        )}
        {actions.topUp && (
          <CommandButton shortcut="T" variant="secondary" busy={busy} disabled={disabled} onClick={() => void send({ type: 'top-up' })}>
            Top up recorded
          </CommandButton>
        )}
        {actions.finish && (
          <CommandButton shortcut="F" busy={busy} disabled={disabled} onClick={() => void send({ type: 'finish' })}>
            Finish
          </CommandButton>
        )}
      </div>
      {askingEarly && actions.applyEarly && (
        <ReasonForm
          label="The hold is not met yet. Why apply the next stage now?"
          submitLabel="Apply next stage now"
          busy={busy}
          onCancel={() => setAskingEarly(false)}
          onSubmit={(reason) => void send({ type: 'advance', reason }).then((ok) => ok && setAskingEarly(false))}
        />
      )}
    </section>
  );
}
