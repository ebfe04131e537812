import { maxPlannedPressureKpa } from '@shared/plans/stages';
import { findProfile } from '@shared/procedures/profiles';
import type { TestPlan } from '@shared/schemas/plans';
import { CellLink, DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';

const column = tableColumns<TestPlan>();

const columns: DataTableColumns<TestPlan> = [
  column.accessor('name', {
    header: 'Plan',
    sortFn: 'text',
    cell: (info) => <CellLink to={paths.plan.href(info.row.original.id)}>{info.getValue()}</CellLink>,
  }),
  column.accessor((p) => findProfile(p.procedureId)?.name ?? p.procedureId, { id: 'procedure', header: 'Procedure', sortFn: 'text' }),
  column.accessor((p) => `${p.plate.shape} ${p.plate.sizeMm} mm`, {
    id: 'plate',
    header: 'Plate',
    sortFn: 'alphanumeric',
    cell: (info) => <MonoCell>{info.getValue()}</MonoCell>,
  }),
  column.accessor((p) => maxPlannedPressureKpa(p), {
    id: 'peak',
    header: 'Largest kPa',
    sortFn: 'basic',
    cell: (info) => <MonoCell>{info.getValue()}</MonoCell>,
  }),
  column.accessor('updatedAt', { header: 'Updated', sortFn: 'alphanumeric', cell: (info) => <MonoCell>{formatDate(info.getValue())}</MonoCell> }),
];

export function PlansTable({ plans }: { plans: TestPlan[] }) {
  return <DataTable caption="Test plans" columns={columns} data={plans} initialSorting={[{ id: 'updatedAt', desc: true }]} />;
}
