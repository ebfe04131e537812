import { formatFixed } from '@shared/units/format';

/** A labelled value in large monospace numerals, readable at arm's length; the unit wraps below rather than overflow the tile. */
export function Readout({ label, value, unit }: { label: string; value: string; unit?: string }) {
  return (
    <div className="flex min-w-0 flex-col rounded-md border-2 border-neutral-300 px-3 py-2">
      <span className="text-sm font-semibold text-neutral-800">{label}</span>
      <span className="flex min-w-0 flex-wrap items-baseline gap-x-1 font-mono text-2xl font-bold text-neutral-950 sm:text-3xl">
        <span className="min-w-0 break-all">{value}</span>
        {unit && <span className="text-base font-normal text-neutral-800">{unit}</span>}
      </span>
    </div>
  );
}

/** Formats an optional number for a readout: "—" when not recorded, never "-0.00". */
export function formatNumber(value: number | null | undefined, digits = 2): string {
  return formatFixed(value, digits);
}
