import { runEventLine } from '@shared/runs/event-text';
import { formatPlanned } from '@shared/units/format';
import { formatNumber, Readout } from '../../../components/readout';
import type { ReplayEvent } from '../api/replay-api';
import { formatElapsed, type StageSpan } from '../utils/timeline';


export interface ReplayStatePanelProps {
  fromMs: number;
  tMs: number;
  stage: StageSpan | null;
  pressure: { value: number; unit: string } | null;
  /** Mean pressure under the plate, kPa, as the console measured it. */
  pressureKpa: number | null;
  meanSettlementMm: number | null;
  /** Events up to the replay time, newest first. */
  events: readonly ReplayEvent[];
}

/** The run as it stood at the replay time: stage and target, readings, and what had happened so far. */
export function ReplayStatePanel({ fromMs, tMs, stage, pressure, pressureKpa, meanSettlementMm, events }: ReplayStatePanelProps) {
  const holding = stage?.reachedMs != null && stage.reachedMs <= tMs;
  return (
    <section aria-label="State at the replay time" className="flex flex-col gap-3">
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-5">
        {/* Counted from 1, as the console counts them. */}
        <Readout label="Stage" value={stage ? String(stage.stageIndex + 1) : '—'} />
        <Readout
          label={stage ? (holding ? 'Target (holding)' : 'Target (loading)') : 'Target'}
          value={stage ? formatPlanned(stage.targetKpa, 'kPa') : '—'}
          unit="kPa"
        />
        <Readout label="Oil pressure" value={formatNumber(pressure?.value, 2)} unit={pressure?.unit} />
        <Readout label="Plate pressure" value={formatNumber(pressureKpa, 1)} unit="kPa" />
        <Readout label="Mean settlement" value={formatNumber(meanSettlementMm, 2)} unit="mm" />
      </div>
      <div>
        <h3 className="mb-1 font-bold">Events so far</h3>
        {events.length === 0 ? (
          <p className="text-neutral-800">Nothing yet.</p>
        ) : (
          <ol aria-label="Events so far" className="max-h-64 divide-y divide-neutral-300 overflow-y-auto rounded-md border-2 border-neutral-300">
            {events.map((e) => (
              <li key={e.id} className={`flex gap-3 px-3 py-1 ${e.kind.startsWith('alarm-') ? 'font-semibold text-alarm-900' : ''}`}>
                <span className="font-mono">{formatElapsed(e.atMs - fromMs)}</span>
                <span>{runEventLine(e)}</span>
              </li>
            ))}
          </ol>
        )}
      </div>
    </section>
  );
}
