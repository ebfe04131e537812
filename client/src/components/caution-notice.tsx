/** The standing caution, shown where results are (console, interpretation, report pages): where they stop being valid, and who decides. */
export function CautionNotice({ className = '' }: { className?: string }) {
  return (
    <aside aria-labelledby="standing-caution" className={`rounded-md border-2 border-caution-700 bg-caution-50 px-4 py-3 text-caution-950 ${className}`}>
      <h2 id="standing-caution" className="font-bold">
        <span aria-hidden="true">⚠ </span>Caution
      </h2>
      <ul className="mt-1 list-disc space-y-0.5 pl-5 text-sm">
        <li>A result applies to one plate at one spot and one depth.</li>
        <li>A real footing stresses the soil 2–3 plate widths deeper than the plate did.</li>
        <li>A 24-hour hold does not capture the long-term settlement of clay.</li>
        <li>The hydraulic system and the reaction load are hazards: keep clear while under load.</li>
        <li>Local codes and a licensed engineer's judgement decide; these figures only inform them.</li>
      </ul>
    </aside>
  );
}
