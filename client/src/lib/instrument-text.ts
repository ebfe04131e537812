import type { Instrument } from '@shared/schemas/instruments';

type RangeFacts = Pick<Instrument, 'rangeMin' | 'rangeMax' | 'unit'>;

/** "0 – 50 mm", "up to 700 bar", or "—" when no range is recorded. */
export function formatRange({ rangeMin, rangeMax, unit }: RangeFacts): string {
  if (rangeMin == null && rangeMax == null) return '—';
  if (rangeMin == null) return `up to ${rangeMax} ${unit}`;
  if (rangeMax == null) return `from ${rangeMin} ${unit}`;
  return `${rangeMin} – ${rangeMax} ${unit}`;
}

/** How an instrument is named in pickers: serial first, as it is engraved on the kit. */
export function instrumentName(instrument: Pick<Instrument, 'serialNumber' | 'makeModel'>): string {
  return `${instrument.serialNumber} · ${instrument.makeModel}`;
}
