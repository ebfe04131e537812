import { type NextStepPrompt, promptBlocksLoading } from '@shared/hold/next-step';
import { useState } from 'react';
import type { RunCommand, RunView } from '@shared/schemas/runs';
import { formatPlanned, formatValue } from '@shared/units/format';
import { formatNumber } from '../../../components/readout';
import { BRANCH_LABELS, stageLabel } from '../utils/run-format';
import { CommandButton, ReasonForm } from './command-button';
import type { MainAction } from './run-bar';
import { UnloadForm } from './unload-form';

/** Which of the stage actions apply to a run as it stands. */
export function stageActions(view: RunView) {
  const { phase } = view;
  const isLast = view.stageIndex >= view.stages.length - 1;
  const holding = phase === 'holding' || phase === 'hold-met';
  // A next stage beyond the jack's calibration or rating is never applied: the server refuses it too.
  const nextRefused = phase === 'hold-met' && promptBlocksLoading(view.prompt);
  return {
    applyNext: phase === 'hold-met' && !isLast && !nextRefused,
    applyEarly: phase === 'holding' && !isLast,
    nextRefused,
    // Loading can end at any loading stage; the server derives the unloading stages from the one reached.
    unload: (phase === 'pumping' || holding) && view.stages[view.stageIndex]?.branch === 'loading',
    finish: phase === 'hold-met' && isLast, // the server finishes only once the last hold is met
    stageReached: phase === 'pumping' && (view.manual || view.live.pressureKpa === null),
    // The server records top-ups during a hold only.
    topUp: holding,
  };
}

export type StageActions = ReturnType<typeof stageActions>;

function PromptFigures({ prompt }: { prompt: NextStepPrompt }) {
  return (
    <dl className="grid grid-cols-1 gap-2 sm:grid-cols-3 lg:grid-cols-1">
      <div className="rounded-md border-2 border-neutral-300 p-2">
        <dt className="text-sm font-semibold text-neutral-800">Target pressure</dt>
        <dd className="font-mono text-3xl font-bold">
          {formatPlanned(prompt.targetKpa, 'kPa')} <span className="text-base font-normal">kPa</span>
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
          {formatValue(prompt.gaugePressure, prompt.gaugeUnit)} <span className="text-base font-normal">{prompt.gaugeUnit}</span>
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
  /** The action the pinned bar carries: not repeated here. */
  main: MainAction;
}

/** What the step panel says when there is no prompt: the stage still to come, or that this is the last. */
function noPromptText(view: RunView, actions: StageActions): string {
  const following = view.stages[view.stageIndex + 1];
  if (following) return `Then ${stageLabel(following, view.stages.length).replace(/^Stage/, 'stage')}, once this hold is met.`;
  return actions.finish ? 'This is the last stage: finish the run.' : 'This is the last stage: finish the run once its hold is met.';
}

/** What to apply next and the one-touch actions of the stage. */
export function StepPanel({ view, actions, send, busy, disabled, askingEarly, setAskingEarly, main }: StepPanelProps) {
  const { prompt } = view;
  const pumping = view.phase === 'pumping' || view.phase === 'preparing';
  const [askingUnload, setAskingUnload] = useState(false);
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
        <p className="text-lg font-semibold">{noPromptText(view, actions)}</p>
      )}
      <div className="flex flex-wrap gap-2">
        {actions.applyNext && main !== 'apply-next' && (
          <CommandButton shortcut="A" className="text-lg" busy={busy} disabled={disabled} onClick={() => void send({ type: 'advance' })}>
            Apply next stage
          </CommandButton>
        )}
        {actions.applyEarly && !askingEarly && (
          <CommandButton shortcut="A" variant="secondary" size="glove" disabled={disabled} onClick={() => setAskingEarly(true)}>
            Apply next stage early…
          </CommandButton>
        )}
        {actions.stageReached && main !== 'stage-reached' && (
          <CommandButton shortcut="R" busy={busy} disabled={disabled} onClick={() => void send({ type: 'stage-reached' })}>
            Stage reached
          </CommandButton>
        )}
        {actions.unload && !askingUnload && (
          <CommandButton variant={actions.nextRefused ? 'primary' : 'secondary'} size="glove" disabled={disabled} onClick={() => setAskingUnload(true)}>
            Go to unloading…
          </CommandButton>
        )}
        {actions.topUp && main !== 'top-up' && (
          <CommandButton shortcut="T" variant="secondary" size="glove" busy={busy} disabled={disabled} onClick={() => void send({ type: 'top-up' })}>
            Top up recorded
          </CommandButton>
        )}
      </div>
      {askingUnload && actions.unload && (
        <UnloadForm
          reason={actions.nextRefused ? 'jack-limit' : undefined}
          busy={busy}
          onCancel={() => setAskingUnload(false)}
          onSubmit={(command) => void send(command).then((ok) => ok && setAskingUnload(false))}
        />
      )}
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
