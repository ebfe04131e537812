import type { Finding, FootingAnalysis } from '@shared/interpretation/analyze-record';
import { Readout } from '../../../components/readout';
import { FindingView, figure, Provenance } from './finding';

/** The plate results scaled to the footing: ultimate pressure with its shape factor, safe pressures in shear and settlement, the allowable pressure and what it rests on. */
export function FootingPanel({ footing }: { footing: Finding<FootingAnalysis> }) {
  return (
    <FindingView finding={footing}>
      {(f) => (
        <div className="flex flex-col gap-3">
          <p>
            Footing: {f.footing.shape}, <span className="font-mono">{f.footing.widthM} m</span> wide on {f.footing.soilBehaviour} soil, from the{' '}
            {f.plateLabel}.
          </p>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
            <Readout label="Allowable bearing pressure (net)" value={f.allowable.applies ? figure(f.allowable.result.qAllowKpa, '') : '—'} unit="kPa" />
            <Readout
              label={f.ultimate.applies && f.ultimate.result.lowerBound ? 'Footing q_ult (at least)' : 'Footing q_ult'}
              value={f.ultimate.applies ? figure(f.ultimate.result.qUltKpa, '') : '—'}
              unit="kPa"
            />
            <Readout label="Net safe (shear)" value={f.shear.applies ? figure(f.shear.result.netSafeKpa, '') : '—'} unit="kPa" />
            <Readout label="Safe for settlement" value={f.settlement.applies ? figure(f.settlement.result.qKpa, '') : '—'} unit="kPa" />
          </div>
          <p>{f.basis.statement}</p>
          {f.allowable.applies ? (
            <p>
              {f.allowable.result.governs ? `${f.allowable.result.governs === 'shear' ? 'Shear' : 'Settlement'} governs.` : ''}{' '}
              {f.allowable.result.reason ?? ''}
            </p>
          ) : (
            <p className="text-neutral-800">Allowable pressure not determined: {f.allowable.reason}</p>
          )}
          <FindingView finding={f.ultimate}>
            {(u) => (
              <>
                {u.shape && (
                  <p className="text-sm">
                    Shape factor from the plate to the footing: <span className="font-mono">× {u.shape.factor.toFixed(3)}</span> ({u.shape.footingFactor.toFixed(2)}{' '}
                    for the footing over {u.shape.plateFactor.toFixed(2)} for the plate).
                  </p>
                )}
                <Provenance formula={u.formula} source={u.source} />
              </>
            )}
          </FindingView>
          <FindingView finding={f.shear}>
            {(s) => (
              <>
                <p className="text-sm">
                  Factor of safety {s.factorOfSafety}; overburden {figure(s.overburdenKpa, 'kPa')}; gross safe pressure {figure(s.grossSafeKpa, 'kPa')}.
                </p>
                <Provenance formula={s.formula} source={s.source} />
              </>
            )}
          </FindingView>
          <FindingView finding={f.settlement}>
            {(s) => (
              <>
                <p className="text-sm">
                  Plate settlement matching the permissible footing settlement: {figure(s.plateSettlementMm, 'mm', 2)} (ratio {s.ratio.toFixed(3)}).{' '}
                  {s.reason ?? ''}
                </p>
                <Provenance formula={s.formula} source={s.source} />
              </>
            )}
          </FindingView>
          {f.widthForColumnLoad && (
            <FindingView finding={f.widthForColumnLoad}>
              {(w) => (
                <p>
                  Square footing for a column load of <span className="font-mono">{w.columnLoadKn} kN</span>:{' '}
                  <span className="font-mono">{figure(w.widthM, 'm', 2)}</span> wide ({figure(w.bearingPressureKpa, 'kPa')}; settlement limit only, check it
                  against the allowable pressure){w.limitedByTestRange ? '; the test stopped short, so the width is on the safe side' : ''}.
                </p>
              )}
            </FindingView>
          )}
        </div>
      )}
    </FindingView>
  );
}
