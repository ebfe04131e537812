import type { Instrument, InstrumentKind } from '@shared/schemas/instruments';
import type { ComponentProps } from 'react';
import { calibrationWord, needsCalibration } from '../../../components/calibration-status';
import { SelectField } from '../../../components/form-field';
import { instrumentName } from '../../../lib/instrument-text';

/** The warning beside a chosen instrument that is overdue or was never calibrated. */
export function CalibrationFlag({ instrument }: { instrument: Instrument | undefined }) {
  if (!instrument || !needsCalibration(instrument.status)) return null;
  const overdue = instrument.status === 'overdue';
  return (
    <p role="note" className="rounded-md border-2 border-alarm-700 bg-alarm-50 p-2 font-semibold text-alarm-900">
      <span aria-hidden="true">⚠ </span>
      {overdue
        ? `${instrument.serialNumber} is overdue for calibration (was due ${instrument.current?.dueOn ?? '—'}).`
        : `${instrument.serialNumber} has no calibration on record.`}{' '}
      A run started with it records that it was used anyway.
    </p>
  );
}

type PickerProps = Omit<ComponentProps<typeof SelectField>, 'options'> & {
  instruments: Instrument[];
  kind: InstrumentKind;
  /** The chosen instrument's id, to flag it when its calibration has lapsed. */
  chosenId: number | null | undefined;
};

/** A select of registered instruments of one kind; a lapsed calibration is named in the option and flagged below. */
export function InstrumentPicker({ instruments, kind, chosenId, ...select }: PickerProps) {
  const ofKind = instruments.filter((i) => i.kind === kind);
  const options = ofKind.map((i) => ({
    value: String(i.id),
    label: needsCalibration(i.status) ? `${instrumentName(i)} — ⚠ ${calibrationWord(i.status)}` : instrumentName(i),
  }));
  const chosen = ofKind.find((i) => i.id === Number(chosenId));
  return (
    <div className="flex flex-col gap-2">
      <SelectField options={options} placeholder="None" {...select} />
      <CalibrationFlag instrument={chosen} />
    </div>
  );
}
