import type { HoldEvaluation, HoldEvidence } from '@shared/hold/verdict';
import type { ReactNode } from 'react';
import { formatNumber } from '../../../components/readout';
import { formatMinutes, VERDICTS } from '../utils/run-format';

const VERDICT_BOX: Record<HoldEvaluation['verdict'], string> = {
  settling: 'border-neutral-800 bg-white text-neutral-950',
  satisfied: 'border-neutral-950 bg-neutral-900 text-white',
  'failure-suspected': 'border-alarm-700 bg-alarm-50 text-alarm-900',
};

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex flex-wrap justify-between gap-x-3 border-b border-neutral-300 py-1 last:border-b-0">
      <dt className="text-neutral-800">{label}</dt>
      <dd className="font-mono font-semibold">{children}</dd>
    </div>
  );
}

const mmPerMin = (v: number | null) => `${formatNumber(v, 3)} mm/min`;

/** The figures each kind of hold rule judged, in words a crew reads at a glance. */
function EvidenceFacts({ evidence }: { evidence: HoldEvidence }) {
  switch (evidence.kind) {
    case 'rate':
      return (
        <>
          <Fact label={`Rate over the last ${evidence.windowMin} min`}>
            {mmPerMin(evidence.currentRateMmPerMin)} (limit {mmPerMin(evidence.maxRateMmPerMin)})
          </Fact>
          {evidence.rateUnavailableReason && <Fact label="Rate not yet known">{evidence.rateUnavailableReason}</Fact>}
          <Fact label="Time held">
            {formatMinutes(evidence.heldMin)} of at least {formatMinutes(evidence.minHoldMin)}
          </Fact>
        </>
      );
    case 'consecutive':
      return (
        <>
          <Fact label={`Intervals of ${evidence.intervalMin} min within ${evidence.maxChangeMm} mm`}>
            {evidence.intervalsPassed} of {evidence.intervalsRequired}
          </Fact>
          <Fact label="Latest rate">{mmPerMin(evidence.currentRateMmPerMin)}</Fact>
          <Fact label="Time held">{formatMinutes(evidence.heldMin)}</Fact>
        </>
      );
    case 'fixed':
      return (
        <Fact label="Time held">
          {formatMinutes(evidence.heldMin)} of {formatMinutes(evidence.durationMin)} ({formatMinutes(evidence.remainingMin)} left)
        </Fact>
      );
    case 'percentOfUltimate':
      return (
        <>
          <Fact label="Share of the fitted ultimate settlement">
            {formatNumber(evidence.percentOfUltimate, 1)} % (target {evidence.targetPercent} %)
          </Fact>
          <Fact label="Time held">
            {formatMinutes(evidence.heldMin)} (at least {formatMinutes(evidence.minHoldMin)}, at most {formatMinutes(evidence.maxHoldMin)})
          </Fact>
        </>
      );
  }
}

/** The hold verdict with its evidence, its estimated time to satisfy, and the criterion with its sources. */
export function HoldPanel({ hold }: { hold: HoldEvaluation | null }) {
  if (!hold) {
    return (
      <section aria-labelledby="hold-heading" className="rounded-md border-2 border-neutral-300 p-3">
        <h2 id="hold-heading" className="text-xl font-bold">
          Hold
        </h2>
        <p className="text-neutral-800">The hold is judged once the stage's target pressure is on.</p>
      </section>
    );
  }
  const verdict = VERDICTS[hold.verdict];
  const { evidence } = hold;
  return (
    <section aria-labelledby="hold-heading" className="flex flex-col gap-2 rounded-md border-2 border-neutral-300 p-3">
      <h2 id="hold-heading" className="text-xl font-bold">
        Hold
      </h2>
      <p role="status" className={`rounded-md border-2 px-3 py-2 text-2xl font-bold ${VERDICT_BOX[hold.verdict]}`}>
        <span aria-hidden="true">{verdict.symbol} </span>
        {verdict.label}
      </p>
      <dl>
        <EvidenceFacts evidence={evidence} />
        <Fact label="Estimated time to satisfy">{hold.verdict === 'satisfied' ? 'now' : formatMinutes(hold.etaMin)}</Fact>
        <Fact label="Readings judged">{evidence.readings}</Fact>
      </dl>
      {evidence.failureSignals.length > 0 && (
        <ul className="flex flex-col gap-1">
          {evidence.failureSignals.map((s) => (
            <li key={s.code} className="rounded-md border-2 border-alarm-700 bg-alarm-50 p-2 text-alarm-900">
              <span aria-hidden="true">✖ </span>
              <span className="font-semibold">{s.message}</span>{' '}
              <span className="text-sm">
                ({s.source.tag}: {s.source.text})
              </span>
            </li>
          ))}
        </ul>
      )}
      <div className="text-sm">
        <p className="font-semibold">Criterion: {hold.criterion.text}</p>
        <ul className="list-disc pl-5 text-neutral-800">
          {hold.criterion.sources.map((s) => (
            <li key={s.setting + s.text}>
              {s.text} <span className="italic">({s.tag})</span>
            </li>
          ))}
        </ul>
      </div>
    </section>
  );
}
