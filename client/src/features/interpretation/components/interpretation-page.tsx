import type { RecordAnalysis } from '@shared/interpretation/analyze-record';
import type { TestRecord } from '@shared/records/schema';
import { type ReactNode, useState } from 'react';
import { QueryResult } from '../../../components/query-states';
import { useCan } from '../../../lib/auth';
import { useInterpretation } from '../api/get-interpretation';
import { useInterpretationVersions } from '../api/interpretation-versions';
import type { InterpretationSettings } from '../utils/interpretation-settings';
import { CautionsPanel } from './cautions-panel';
import { CyclesPanel } from './cycles-panel';
import { Downloads } from './downloads';
import { Provenance } from './finding';
import { FootingPanel } from './footing-panel';
import { LoadSettlementCharts } from './load-settlement-charts';
import { ModuliPanel } from './moduli-panel';
import { SaveInterpretationForm } from './save-interpretation-form';
import { SettingsForm } from './settings-form';
import { TimeSettlementPanel } from './time-settlement-panel';
import { UltimateMethodsTable } from './ultimate-methods-table';
import { VersionsList } from './versions-list';

function Section({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="flex flex-col gap-3">
      <h2 id={id} className="text-xl font-bold">
        {title}
      </h2>
      {children}
    </section>
  );
}

/** Which procedure the test followed, and the methods it does not call for with the reason. */
function ProcedureNote({ analysis }: { analysis: RecordAnalysis }) {
  const hidden = [...new Set(Object.values(analysis.procedure.methods).flatMap((s) => (s.shown ? [] : [s.why])))];
  return (
    <div className="flex flex-col gap-1">
      <p>
        Procedure: <strong>{analysis.procedure.name}</strong>.
      </p>
      {analysis.procedure.note && <p className="text-sm">{analysis.procedure.note}</p>}
      {hidden.length > 0 && (
        <div className="text-sm">
          Not shown for this procedure:
          <ul className="list-disc pl-5">
            {hidden.map((why) => (
              <li key={why}>{why}</li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}

/** Everything interpreted from one analysis: plots, methods, footing, moduli, cycles, time–settlement. */
export function AnalysisView({ analysis, record }: { analysis: RecordAnalysis; record: TestRecord }) {
  return (
    <>
      <CautionsPanel cautions={analysis.cautions} warnings={analysis.scalingWarnings} />
      <ProcedureNote analysis={analysis} />
      <Section id="interp-curve" title="Load–settlement curve">
        <LoadSettlementCharts analysis={analysis} />
        <p className="text-sm">{analysis.zeroCorrection.statement}</p>
        {analysis.zeroCorrection.bedding && (
          <>
            <p className="text-sm">{analysis.zeroCorrection.bedding.statement}</p>
            <Provenance formula={analysis.zeroCorrection.bedding.formula} source={analysis.zeroCorrection.bedding.source} />
          </>
        )}
        <Provenance formula={analysis.reduction.formula} source={analysis.reduction.source} />
      </Section>
      <Section id="interp-ultimate" title="Ultimate pressure, by method">
        <UltimateMethodsTable ultimate={analysis.ultimate} chosen={analysis.chosenUltimate} strength={analysis.undrainedStrength} />
      </Section>
      <Section id="interp-footing" title="Footing and allowable bearing pressure">
        <FootingPanel footing={analysis.footing} />
      </Section>
      <Section id="interp-moduli" title="Subgrade and deformation moduli">
        <ModuliPanel analysis={analysis} />
      </Section>
      <Section id="interp-cycles" title="Load–release cycles">
        <CyclesPanel cycles={analysis.cycles} />
      </Section>
      <Section id="interp-time" title="Time–settlement of each stage">
        <TimeSettlementPanel record={record} stages={analysis.timeSettlement} />
      </Section>
    </>
  );
}

/** The interpretation of a run: settings, the analysis they give, saving a version, the versions saved, downloads. */
export function InterpretationPage({ runId, record }: { runId: number; record: TestRecord }) {
  const [settings, setSettings] = useState<InterpretationSettings>({});
  const analysis = useInterpretation(runId, settings);
  const versions = useInterpretationVersions(runId);
  const canSave = useCan('plans:write');
  return (
    <div className="flex flex-col gap-6">
      <Downloads runId={runId} />
      <Section id="interp-settings" title="Settings">
        <SettingsForm settings={settings} onApply={setSettings} busy={analysis.isFetching} />
      </Section>
      <QueryResult query={analysis} loadingLabel="Interpreting the record…">
        {(a) => <AnalysisView analysis={a} record={record} />}
      </QueryResult>
      {canSave && (
        <Section id="interp-save" title="Save this interpretation">
          <SaveInterpretationForm key={settings.ultimateMethod ?? ''} runId={runId} settings={settings} />
        </Section>
      )}
      <Section id="interp-versions" title="Saved versions">
        <QueryResult query={versions} loadingLabel="Loading saved versions…">
          {(v) => <VersionsList versions={v} />}
        </QueryResult>
      </Section>
    </div>
  );
}
