import type { Finding } from '@shared/interpretation/analyze-record';
import type { ReactNode } from 'react';

/** Why a figure is missing: a method the procedure does not call for says so in its own words. */
export function missingText(reason: string): string {
  return reason.startsWith('not shown') ? `Not shown${reason.slice('not shown'.length)}` : `Not determined: ${reason}`;
}

/** A method's result, or the reason it does not apply or is not shown, in the same place. */
export function FindingView<T>({ finding, children }: { finding: Finding<T>; children: (result: T) => ReactNode }) {
  if (!finding.applies) return <p className="text-neutral-800">{missingText(finding.reason)}</p>;
  return <>{children(finding.result)}</>;
}

/** The formula and source every figure carries. */
export function Provenance({ formula, source }: { formula: string; source: string }) {
  return (
    <p className="text-sm text-neutral-700">
      <span className="font-mono">{formula}</span> — {source}
    </p>
  );
}

/** A number with its unit, or "—". */
export function figure(value: number | null | undefined, unit: string, digits = 1): string {
  return value == null || !Number.isFinite(value) ? '—' : `${value.toFixed(digits)} ${unit}`;
}
