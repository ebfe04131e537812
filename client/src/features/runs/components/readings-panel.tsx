import type { RunView } from '@shared/schemas/runs';
import { formatPlanned, formatValue } from '@shared/units/format';
import { useRef } from 'react';
import { Readout } from '../../../components/readout';
import { currentRate } from '../utils/hold-evidence';
import { formatDuration, formatTilt, tiltIsLevel } from '../utils/run-format';

/** The tilt in words with its deadband: what it read last decides which threshold applies now. */
function useTiltText(slope: number | null): string {
  const wasLevel = useRef(false);
  const text = formatTilt(slope, wasLevel.current);
  wasLevel.current = tiltIsLevel(slope, wasLevel.current);
  return text;
}

interface ReadingsPanelProps {
  view: RunView;
  /** Age of the data shown, wall-clock seconds; null before the first sample. */
  dataAgeS: number | null;
}

/** The big numbers: pressure, force, jack gauge, settlement per gauge and mean, tilt and rate. */
export function ReadingsPanel({ view, dataAgeS }: ReadingsPanelProps) {
  const { live } = view;
  const target = view.stages[view.stageIndex]?.targetKpa ?? null;
  const rate = view.hold ? currentRate(view.hold.evidence) : null;
  const tilt = useTiltText(live.tiltSlope);
  const nearStop = live.meanSettlementMm !== null && live.meanSettlementMm >= 0.8 * view.stopLimitMm;
  return (
    <section aria-labelledby="readings-heading" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="readings-heading" className="text-xl font-bold">
          Readings
        </h2>
        <p className="text-neutral-800">
          Data age: <span className="font-mono font-semibold">{dataAgeS === null ? 'no data yet' : formatDuration(dataAgeS)}</span>
        </p>
      </div>
      <div className="grid grid-cols-2 gap-2 lg:grid-cols-4">
        <Readout label="Target pressure" value={formatPlanned(target, 'kPa')} unit="kPa" />
        <Readout label="Actual pressure" value={formatValue(live.pressureKpa, 'kPa')} unit="kPa" />
        <Readout label="Plate force" value={formatValue(live.plateForceKn, 'kN')} unit="kN" />
        <Readout label="Jack gauge" value={formatValue(live.oilPressure, live.oilUnit)} unit={live.oilUnit ?? undefined} />
        <Readout label="Mean settlement" value={formatValue(live.meanSettlementMm, 'mm')} unit="mm" />
        <Readout label="Rate" value={formatValue(rate, 'mm/min')} unit="mm/min" />
        <Readout label="Tilt" value={tilt} />
        <Readout label="Gauge spread" value={formatValue(live.spreadMm, 'mm')} unit="mm" />
      </div>
      {live.pressureProblem && (
        <p role="alert" className="rounded-md border-2 border-alarm-700 bg-alarm-50 p-2 font-semibold text-alarm-900">
          <span aria-hidden="true">✖ </span>
          {live.pressureProblem}
        </p>
      )}
      <p
        className={`rounded-md border-2 p-2 ${nearStop ? 'border-caution-700 bg-caution-50 font-semibold text-caution-950' : 'border-neutral-300 text-neutral-800'}`}
      >
        <span aria-hidden="true">{nearStop ? '⚠ ' : ''}</span>
        The test stops at a mean settlement of <span className="font-mono">{view.stopLimitMm} mm</span>
        {nearStop ? ': the plate is close to it.' : '.'}
      </p>
      <ul className="grid grid-cols-2 gap-2 lg:grid-cols-4" aria-label="Gauges">
        {live.gauges.map((g) => (
          <li key={g.key}>
            <Readout label={`${g.label} settlement`} value={formatValue(g.settlementMm, 'mm')} unit="mm" />
            <p className="px-1 text-sm text-neutral-800">
              reading <span className="font-mono">{formatValue(g.readingMm, 'mm')}</span> mm
              {g.travelMm !== null && (
                <>
                  {' '}
                  of <span className="font-mono">{g.travelMm}</span> mm travel
                </>
              )}
            </p>
          </li>
        ))}
      </ul>
    </section>
  );
}
