import type { LabelledModulus, RecordAnalysis } from '@shared/interpretation/analyze-record';
import { FindingView, figure, Provenance } from './finding';

function SubgradeView({ title, k }: { title: string; k: LabelledModulus }) {
  return (
    <div>
      <h3 className="font-semibold">
        {k.label}, {title}
      </h3>
      <p className="font-mono text-lg">
        k = {figure(k.kMnM3, 'MN/m³')} ({figure(k.kPci, 'pci', 0)})
      </p>
      <p className="text-sm">
        at {figure(k.pressureKpa, 'kPa')} and {figure(k.settlementMm, 'mm', 2)} {k.reason ?? ''}
      </p>
      <Provenance formula={k.formula} source={k.source} />
    </div>
  );
}

/** k labelled with its plate (and the 750/762 mm value only as measured or by a named conversion), Ev1/Ev2 with plate and convention, and E from the first loading. */
export function ModuliPanel({ analysis }: { analysis: RecordAnalysis }) {
  const { subgradeModulus: sg, deformationModuli, evAcceptance, elasticModulus, unloadReloadModulus } = analysis;
  return (
    <div className="grid gap-5 lg:grid-cols-2">
      <div>
        <FindingView finding={sg.atSettlement}>{(k) => <SubgradeView title="fixed settlement" k={k} />}</FindingView>
        {sg.atSettlement.applies && (
          <p className="text-sm">
            Settlement basis {sg.settlementBasis}; loading curve from application {sg.application} of each load level.
          </p>
        )}
      </div>
      <FindingView finding={sg.atPressure}>{(k) => <SubgradeView title="10 psi" k={k} />}</FindingView>
      {sg.atSettlement.applies && (
        <div>
          <h3 className="font-semibold">k, 750/762 mm plate</h3>
          <FindingView finding={sg.standardPlate}>
            {(s) => (
              <>
                <p className="font-mono text-lg">k = {figure(s.kMnM3, 'MN/m³')}</p>
                <p className="text-sm">{s.label}.</p>
                {s.caution && <p className="text-sm font-semibold">{s.caution}</p>}
                <Provenance formula={s.formula} source={s.source} />
                <FindingView finding={sg.cbrEstimate}>
                  {(c) => (
                    <>
                      <p>CBR estimate from that k: {figure(c.cbrPercent, '%')}</p>
                      <Provenance formula={c.formula} source={c.source} />
                    </>
                  )}
                </FindingView>
              </>
            )}
          </FindingView>
          {sg.soaked && (
            <FindingView finding={sg.soaked}>
              {(c) => (
                <>
                  <p className="font-mono">
                    k, {sg.plateMm} mm plate, soaked = {figure(c.kMnM3, 'MN/m³')} (× {c.factor.toFixed(3)})
                  </p>
                  <Provenance formula={c.formula} source={c.source} />
                </>
              )}
            </FindingView>
          )}
        </div>
      )}
      <div>
        <h3 className="font-semibold">Deformation moduli (Ev1, Ev2)</h3>
        <FindingView finding={deformationModuli}>
          {(d) => (
            <>
              <p className="font-mono text-lg">
                Ev1 = {figure(d.ev1.evMnM2, 'MN/m²')}; Ev2 = {figure(d.ev2?.evMnM2, 'MN/m²')}; Ev2/Ev1 = {figure(d.ratio, '', 2)}
              </p>
              <p className="text-sm">{d.statement}</p>
              <Provenance formula={d.formula} source={d.source} />
              <FindingView finding={evAcceptance}>
                {(v) => (
                  <p className={v.passed ? '' : 'font-semibold'}>
                    Requirement {v.passed ? 'met' : 'NOT met'} ({v.name}): {v.checks.map((c) => c.message).join(' ')}
                  </p>
                )}
              </FindingView>
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
      <div>
        <h3 className="font-semibold">Unload–reload modulus</h3>
        <FindingView finding={unloadReloadModulus}>
          {(e) => (
            <>
              <p className="font-mono text-lg">E_ur = {figure(e.eMpa, 'MPa')}</p>
              <p className="text-sm">
                Unloading from {figure(e.toKpa, 'kPa')} to {figure(e.fromKpa, 'kPa')}; Poisson’s ratio {e.poisson}.
              </p>
              <Provenance formula={e.formula} source={e.source} />
            </>
          )}
        </FindingView>
      </div>
    </div>
  );
}
