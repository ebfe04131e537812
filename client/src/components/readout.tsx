/** A labelled value in large monospace numerals, readable at arm's length. */
export function Readout({ label, value, unit }: { label: string; value: string; unit?: string }) {
  return (
    <div className="flex flex-col rounded-md border-2 border-neutral-300 px-3 py-2">
      <span className="text-sm font-semibold text-neutral-800">{label}</span>
      <span className="font-mono text-2xl font-bold text-neutral-950 sm:text-3xl">
        {value}
        {unit && <span className="ml-1 text-base font-normal text-neutral-800">{unit}</span>}
      </span>
    </div>
  );
}

/** Formats an optional number for a readout: "—" when not recorded. */
export function formatNumber(value: number | null | undefined, digits = 2): string {
  return value == null || Number.isNaN(value) ? '—' : value.toFixed(digits);
}
