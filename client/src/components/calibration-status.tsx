import type { CalibrationStatus, InstrumentKind } from '@shared/schemas/instruments';

/** A calibration status as a channel reports it: an instrument's status, or no instrument at all. */
export type ChannelCalibration = CalibrationStatus | 'no-instrument';

/** Word and symbol of each status, so it reads without colour (sunlight, colour blindness). */
const STATUS: Record<ChannelCalibration, { symbol: string; word: string; tone: string }> = {
  'in-calibration': { symbol: '✓', word: 'In calibration', tone: 'border-neutral-700 bg-white text-neutral-950' },
  'due-soon': { symbol: '◷', word: 'Due soon', tone: 'border-caution-700 bg-caution-50 text-caution-950' },
  overdue: { symbol: '⚠', word: 'Overdue', tone: 'border-alarm-700 bg-alarm-50 text-alarm-900 font-bold' },
  uncalibrated: { symbol: '?', word: 'Not calibrated', tone: 'border-caution-700 bg-caution-50 text-caution-950' },
  'no-instrument': { symbol: '—', word: 'No instrument', tone: 'border-neutral-400 bg-white text-neutral-800' },
};

export const calibrationWord = (status: ChannelCalibration) => STATUS[status].word;

/** Whether a reading through this instrument should not be trusted without a note. */
export const needsCalibration = (status: ChannelCalibration) => status === 'overdue' || status === 'uncalibrated';

export function CalibrationBadge({ status }: { status: ChannelCalibration }) {
  const { symbol, word, tone } = STATUS[status];
  return (
    <span className={`inline-flex items-center gap-1 rounded-md border-2 px-2 py-0.5 whitespace-nowrap ${tone}`}>
      <span aria-hidden="true">{symbol}</span>
      {word}
    </span>
  );
}

export const KIND_LABELS: Record<InstrumentKind, string> = {
  gauge: 'Displacement gauge',
  pressure: 'Pressure transducer',
  jack: 'Jack',
  'load-cell': 'Load cell',
};
