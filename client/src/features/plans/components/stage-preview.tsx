import { type Plate, plateForceKn } from '@shared/domain/plate';
import type { PlannedStage } from '@shared/plans/stages';
import { Readout } from '../../../components/readout';

const BRANCH_WORDS: Record<PlannedStage['branch'], string> = { seating: 'Seating', loading: 'Loading', unloading: 'Unloading', reloading: 'Second loading' };

/** The stages the plan implies, with the plate force each target pressure means. */
export function StagePreview({ stages, plate }: { stages: PlannedStage[]; plate: Plate }) {
  const peakKpa = Math.max(...stages.map((s) => s.targetKpa));
  const repeated = stages.some((s) => s.repetition > 1);
  return (
    <section aria-labelledby="stage-preview-title" className="flex flex-col gap-3">
      <h2 id="stage-preview-title" className="text-lg font-bold">
        Stage sequence
      </h2>
      <div className="grid grid-cols-2 gap-2">
        <Readout label="Stages" value={String(stages.length)} />
        <Readout label="Largest pressure" value={peakKpa.toFixed(0)} unit="kPa" />
        <Readout label="Largest plate force" value={plateForceKn(plate, peakKpa).toFixed(1)} unit="kN" />
      </div>
      <div className="max-h-96 overflow-auto rounded-md border-2 border-neutral-300">
        <table className="w-full text-left">
          <caption className="sr-only">Planned stages</caption>
          <thead className="sticky top-0 bg-neutral-100">
            <tr>
              <th scope="col" className="px-2 py-1">
                #
              </th>
              <th scope="col" className="px-2 py-1">
                Stage
              </th>
              <th scope="col" className="px-2 py-1 text-right">
                kPa
              </th>
              <th scope="col" className="px-2 py-1 text-right">
                kN
              </th>
            </tr>
          </thead>
          <tbody className="font-mono">
            {stages.map((s) => (
              <tr key={s.index} className="border-t border-neutral-300">
                <td className="px-2 py-1">{s.index}</td>
                <td className="px-2 py-1 font-sans">
                  {BRANCH_WORDS[s.branch]}
                  {repeated && s.branch !== 'seating' && ` (${s.repetition})`}
                </td>
                <td className="px-2 py-1 text-right text-lg font-bold">{s.targetKpa}</td>
                <td className="px-2 py-1 text-right">{plateForceKn(plate, s.targetKpa).toFixed(1)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
