import type { RunView } from '@shared/schemas/runs';
import { formatNumber, Readout } from '../../../components/readout';
import { currentRate } from '../utils/hold-evidence';
import { formatDuration, formatTilt } from '../utils/run-format';

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
        <Readout label="Target pressure" value={formatNumber(target, 0)} unit="kPa" />
        <Readout label="Actual pressure" value={formatNumber(live.pressureKpa, 1)} unit="kPa" />
        <Readout label="Plate force" value={formatNumber(live.plateForceKn, 2)} unit="kN" />
        <Readout label="Jack gauge" value={formatNumber(live.oilPressure, 1)} unit={live.oilUnit ?? undefined} />
        <Readout label="Mean settlement" value={formatNumber(live.meanSettlementMm, 2)} unit="mm" />
        <Readout label="Rate" value={formatNumber(rate, 3)} unit="mm/min" />
        <Readout label="Tilt" value={formatTilt(live.tiltSlope)} />
        <Readout label="Gauge spread" value={formatNumber(live.spreadMm, 2)} unit="mm" />
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
            <Readout label={`${g.label} settlement`} value={formatNumber(g.settlementMm, 2)} unit="mm" />
            <p className="px-1 text-sm text-neutral-800">
              reading <span className="font-mono">{formatNumber(g.readingMm, 2)}</span> mm
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
