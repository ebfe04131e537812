import type { RecordAnalysis } from '@shared/interpretation/analyze-record';
import { useMemo } from 'react';
import { arithmeticPlot, logLogPlot } from '../utils/plot-data';
import { XyChart } from './xy-chart';

/** The load–settlement curve on arithmetic axes (through unloading from the peak) with the hyperbola, and on log–log axes in kPa and mm with the two lines of the log–log method. */
export function LoadSettlementCharts({ analysis }: { analysis: RecordAnalysis }) {
  const arithmetic = useMemo(() => arithmeticPlot(analysis), [analysis]);
  const logLog = useMemo(() => logLogPlot(analysis), [analysis]);
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <XyChart label="Load–settlement curve, arithmetic axes" data={arithmetic} xLabel="Plate pressure q, kPa" yLabel="Settlement s, mm" />
      <XyChart label="Load–settlement curve, log–log axes" data={logLog} xLabel="Plate pressure q, kPa (log scale)" yLabel="Settlement s, mm (log scale)" log={{ x: true, y: true }} />
    </div>
  );
}
