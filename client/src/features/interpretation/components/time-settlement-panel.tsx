import type { StageTimeSettlement } from '@shared/interpretation/analyze-record';
import type { TestRecord } from '@shared/records/schema';
import { useMemo, useState } from 'react';
import { SelectField } from '../../../components/form-field';
import { timeSettlementPlots } from '../utils/plot-data';
import { FindingView, figure, Provenance } from './finding';
import { XyChart } from './xy-chart';

/** Per loading or reloading stage: settlement against log t and √t, with the creep coefficient and the hyperbolic time fit. */
export function TimeSettlementPanel({ record, stages }: { record: TestRecord; stages: readonly StageTimeSettlement[] }) {
  const [index, setIndex] = useState(stages[0]?.index ?? -1);
  const stage = stages.find((s) => s.index === index);
  const plots = useMemo(() => timeSettlementPlots(record, index), [record, index]);
  if (!stage) return <p className="text-neutral-800">No loading or reloading stage to show.</p>;
  return (
    <div className="flex flex-col gap-4">
      <SelectField
        label="Stage"
        className="max-w-sm"
        value={String(index)}
        onChange={(e) => setIndex(Number(e.target.value))}
        options={stages.map((s) => ({ value: String(s.index), label: `Stage ${s.index}: ${s.branch} to ${s.targetKpa} kPa` }))}
      />
      {plots && (
        <div className="grid gap-4 lg:grid-cols-2">
          <XyChart
            label={`Settlement against log time, stage ${index}`}
            data={plots.logTime}
            xLabel="Time t, min (log scale)"
            log={{ x: true }}
            yLabel="Settlement, mm"
            height={240}
          />
          <XyChart label={`Settlement against root time, stage ${index}`} data={plots.rootTime} xLabel="√t (t in min)" yLabel="Settlement, mm" height={240} />
        </div>
      )}
      <div className="grid gap-4 lg:grid-cols-2">
        <div>
          <h3 className="font-semibold">Creep per log cycle</h3>
          <FindingView finding={stage.creep}>
            {(c) => (
              <>
                <p className="font-mono">
                  k_s = {figure(c.ksMm, 'mm', 3)} between {c.fromMin.toFixed(1)} and {c.toMin.toFixed(1)} min {c.reason ?? ''}
                </p>
                <Provenance formula={c.formula} source={c.source} />
              </>
            )}
          </FindingView>
        </div>
        <div>
          <h3 className="font-semibold">Hyperbolic time fit</h3>
          <FindingView finding={stage.hyperbolicFit}>
            {(h) => (
              <>
                <p className="font-mono">
                  ultimate increment {figure(h.ultimateIncrementMm, 'mm', 3)}; reached {figure(h.percentOfUltimate, '%')}; R² {h.r2.toFixed(4)}
                </p>
                <Provenance formula={h.formula} source={h.source} />
              </>
            )}
          </FindingView>
        </div>
      </div>
    </div>
  );
}
