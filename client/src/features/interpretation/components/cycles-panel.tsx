import type { Finding, LoadCycle } from '@shared/interpretation/analyze-record';
import { DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { FindingView } from './finding';

type Row = LoadCycle & { id: string };
const column = tableColumns<Row>();
const mm = (key: 'totalMm' | 'reboundMm' | 'residualMm' | 'residualIncrementMm', header: string) =>
  column.accessor(key, { header, sortFn: 'basic', cell: (info) => <MonoCell>{`${info.getValue().toFixed(3)} mm`}</MonoCell> });

const columns: DataTableColumns<Row> = [
  column.accessor('levelKpa', { header: 'Level', sortFn: 'basic', cell: (info) => <MonoCell>{`${info.getValue().toFixed(0)} kPa`}</MonoCell> }),
  column.accessor('application', { header: 'Application', sortFn: 'basic' }),
  mm('totalMm', 'Total'),
  mm('reboundMm', 'Rebound'),
  mm('residualMm', 'Residual'),
  mm('residualIncrementMm', 'Residual added'),
];

/** The per-cycle split of a repeated-loading test: total, rebound and residual deflection of every load–release cycle. */
export function CyclesPanel({ cycles }: { cycles: Finding<LoadCycle[]> }) {
  return (
    <FindingView finding={cycles}>
      {(list) => (
        <div className="flex flex-col gap-2">
          <DataTable caption="Load–release cycles" columns={columns} data={list.map((c) => ({ ...c, id: `${c.loadStage}` }))} />
          <p className="text-sm text-neutral-700">
            Total: deflection under load, from the curve’s origin; rebound: recovered on release; residual: left after release (added: by this cycle).
          </p>
        </div>
      )}
    </FindingView>
  );
}
