import type { RecordAnalysis } from '@shared/interpretation/analyze-record';
import { type CorrectedModulus, type SubgradeModulus, subgradeSizeCorrection } from '@shared/interpretation/subgrade';
import { FindingView, figure, Provenance } from './finding';

/** k of the plate carried to the footing's width by Terzaghi's rule for its soil, or null when either is missing. */
export function kForFooting(analysis: RecordAnalysis, k: SubgradeModulus): (CorrectedModulus & { widthM: number }) | null {
  if (k.kMnM3 === null || !analysis.footing.applies) return null;
  const { plateWidthM, footing } = analysis.footing.result;
  const rule = footing.soilBehaviour === 'cohesive' ? 'terzaghiClay' : 'terzaghiSand';
  return { ...subgradeSizeCorrection(k.kMnM3, plateWidthM, footing.widthM, rule), widthM: footing.widthM };
}

function SubgradeView({ title, k, corrected }: { title: string; k: SubgradeModulus; corrected: ReturnType<typeof kForFooting> }) {
  return (
    <div>
      <h3 className="font-semibold">{title}</h3>
      <p className="font-mono text-lg">
        k = {figure(k.kMnM3, 'MN/m³')} ({figure(k.kPci, 'pci')})
      </p>
      <p className="text-sm">
        at {figure(k.pressureKpa, 'kPa')} and {figure(k.settlementMm, 'mm', 2)} {k.reason ?? ''}
      </p>
      <Provenance formula={k.formula} source={k.source} />
      {corrected && (
        <>
          <p className="font-mono">
            for the {corrected.widthM} m footing: k = {figure(corrected.kMnM3, 'MN/m³')} (× {corrected.factor.toFixed(3)})
          </p>
          <Provenance formula={corrected.formula} source={corrected.source} />
        </>
      )}
    </div>
  );
}

/** Modulus of subgrade reaction, Ev1/Ev2 and their ratio, and E from the first loading, each with its formula and source. */
export function ModuliPanel({ analysis }: { analysis: RecordAnalysis }) {
  const { subgradeModulus, deformationModuli, elasticModulus } = analysis;
  return (
    <div className="grid gap-5 lg:grid-cols-2">
      <FindingView finding={subgradeModulus.atSettlement}>
        {(k) => <SubgradeView title="k at a fixed settlement" k={k} corrected={kForFooting(analysis, k)} />}
      </FindingView>
      <FindingView finding={subgradeModulus.atPressure}>
        {(k) => <SubgradeView title="k at a fixed pressure" k={k} corrected={kForFooting(analysis, k)} />}
      </FindingView>
      <div>
        <h3 className="font-semibold">Deformation moduli (Ev1, Ev2)</h3>
        <FindingView finding={deformationModuli}>
          {(d) => (
            <>
              <p className="font-mono text-lg">
                Ev1 = {figure(d.ev1.evMnM2, 'MN/m²')}; Ev2 = {figure(d.ev2?.evMnM2, 'MN/m²')}; Ev2/Ev1 = {figure(d.ratio, '', 2)}
              </p>
              <p className="text-sm">σ0max convention: {d.convention === 'branchMax' ? 'each branch’s own maximum' : 'the first loading’s maximum'}.</p>
              <Provenance formula={d.formula} source={d.source} />
            </>
          )}
        </FindingView>
      </div>
      <div>
        <h3 className="font-semibold">Elastic modulus from the plate</h3>
        <FindingView finding={elasticModulus}>
          {(e) => (
            <>
              <p className="font-mono text-lg">E = {figure(e.eMpa, 'MPa')}</p>
              <p className="text-sm">
                Poisson’s ratio {e.poisson}; secant {figure(e.fromKpa, 'kPa')}–{figure(e.toKpa, 'kPa')}; influence factor {e.influenceFactor}.
              </p>
              <Provenance formula={e.formula} source={e.source} />
            </>
          )}
        </FindingView>
      </div>
    </div>
  );
}
