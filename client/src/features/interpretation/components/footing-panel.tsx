import type { Finding, FootingAnalysis } from '@shared/interpretation/analyze-record';
import { Readout } from '../../../components/readout';
import { FindingView, figure, Provenance } from './finding';

/** The plate results scaled to the footing: ultimate pressure, safe pressures in shear and settlement, the allowable pressure. */
export function FootingPanel({ footing }: { footing: Finding<FootingAnalysis> }) {
  return (
    <FindingView finding={footing}>
      {(f) => (
        <div className="flex flex-col gap-3">
          <p>
            Footing: {f.footing.shape}, <span className="font-mono">{f.footing.widthM} m</span> wide on {f.footing.soilBehaviour} soil; plate{' '}
            <span className="font-mono">{f.plateWidthM} m</span>.
          </p>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
            <Readout label="Allowable bearing pressure" value={f.allowable.applies ? figure(f.allowable.result.qAllowKpa, '') : '—'} unit="kPa" />
            <Readout label="Footing q_ult" value={f.ultimate.applies ? figure(f.ultimate.result.qUltKpa, '') : '—'} unit="kPa" />
            <Readout label="Net safe (shear)" value={f.shear.applies ? figure(f.shear.result.netSafeKpa, '') : '—'} unit="kPa" />
            <Readout label="Safe for settlement" value={f.settlement.applies ? figure(f.settlement.result.qKpa, '') : '—'} unit="kPa" />
          </div>
          {f.allowable.applies ? (
            <p>
              {f.allowable.result.governs ? `${f.allowable.result.governs === 'shear' ? 'Shear' : 'Settlement'} governs.` : ''}{' '}
              {f.allowable.result.reason ?? ''}
            </p>
          ) : (
            <p className="text-neutral-800">Allowable pressure not determined: {f.allowable.reason}</p>
          )}
          <FindingView finding={f.ultimate}>{(u) => <Provenance formula={u.formula} source={u.source} />}</FindingView>
          <FindingView finding={f.shear}>
            {(s) => (
              <>
                <p className="text-sm">
                  Factor of safety {s.factorOfSafety}; overburden {figure(s.overburdenKpa, 'kPa')}.
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
        </div>
      )}
    </FindingView>
  );
}
