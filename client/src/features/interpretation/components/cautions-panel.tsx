import type { Caution } from '@shared/interpretation/analyze-record';
import type { ScalingWarning } from '@shared/interpretation/scaling';

/** The analysis's cautions and scaling warnings, shown before any figure. */
export function CautionsPanel({ cautions, warnings }: { cautions: readonly Caution[]; warnings: readonly ScalingWarning[] }) {
  return (
    <section aria-labelledby="interpretation-cautions" className="rounded-md border-l-8 border-caution-700 bg-caution-50 px-4 py-3 text-caution-950">
      <h2 id="interpretation-cautions" className="text-lg font-bold">
        <span aria-hidden="true">⚠ </span>Read these before using any figure
      </h2>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        {warnings.map((w) => (
          <li key={w.code} className={w.severity === 'warning' ? 'font-semibold' : ''}>
            {w.message}
          </li>
        ))}
        {cautions.map((c) => (
          <li key={c.code}>{c.message}</li>
        ))}
      </ul>
    </section>
  );
}
