import type { Instrument } from '@shared/schemas/instruments';
import { CalibrationBadge, KIND_LABELS } from '../../../components/calibration-status';
import { CellLink, DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { paths } from '../../../config/paths';
import { formatRange } from '../../../lib/instrument-text';

const column = tableColumns<Instrument>();

/** Worst first when sorted ascending, so overdue instruments can be brought to the top. */
const STATUS_ORDER = { overdue: 0, uncalibrated: 1, 'due-soon': 2, 'in-calibration': 3 } as const;

const columns: DataTableColumns<Instrument> = [
  column.accessor('serialNumber', {
    header: 'Serial',
    sortFn: 'alphanumeric',
    cell: (info) => (
      <CellLink to={paths.instrument.href(info.row.original.id)} mono>
        <span className="whitespace-nowrap">{info.getValue()}</span>
      </CellLink>
    ),
  }),
  column.accessor((i) => KIND_LABELS[i.kind], { id: 'kind', header: 'Kind', sortFn: 'text' }),
  column.accessor('makeModel', { header: 'Make and model', sortFn: 'text' }),
  column.accessor((i) => formatRange(i), { id: 'range', header: 'Range', sortFn: 'alphanumeric', cell: (info) => <MonoCell>{info.getValue()}</MonoCell> }),
  column.accessor((i) => (i.resolution == null ? '—' : `${i.resolution} ${i.unit}`), {
    id: 'resolution',
    header: 'Resolution',
    sortFn: 'alphanumeric',
    cell: (info) => <MonoCell>{info.getValue()}</MonoCell>,
  }),
  // A gauge's travel, a jack's rated pressure: the limit each must not be driven past.
  column.accessor((i) => (i.travelMm != null ? `${i.travelMm} mm` : i.ratedPressureMpa != null ? `${i.ratedPressureMpa} MPa` : '—'), {
    id: 'travel',
    header: 'Travel / rating',
    sortFn: 'alphanumeric',
    cell: (info) => <MonoCell>{info.getValue()}</MonoCell>,
  }),
  // The word is the value, so the text filter finds "overdue"; sorting goes by severity.
  column.accessor((i) => `${STATUS_ORDER[i.status]} ${i.status}`, {
    id: 'status',
    header: 'Calibration',
    sortFn: 'alphanumeric',
    cell: (info) => <CalibrationBadge status={info.row.original.status} />,
  }),
  column.accessor((i) => i.current?.dueOn ?? '—', {
    id: 'dueOn',
    header: 'Due',
    sortFn: 'alphanumeric',
    cell: (info) => (
      <MonoCell>{info.row.original.status === 'overdue' ? <strong className="text-alarm-900">{info.getValue()}</strong> : info.getValue()}</MonoCell>
    ),
  }),
];

export function InstrumentsTable({ instruments }: { instruments: Instrument[] }) {
  return <DataTable caption="Instruments" columns={columns} data={instruments} initialSorting={[{ id: 'status', desc: false }]} />;
}
