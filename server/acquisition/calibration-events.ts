/**
 * Calibrations recorded in this process, for whoever must know at once: a run using the instrument
 * applies the new calibration from that moment (the route records, the run manager listens).
 */
import { EventEmitter } from 'node:events';

const emitter = new EventEmitter();
emitter.setMaxListeners(0);

export function calibrationRecorded(instrumentId: number): void {
  emitter.emit('recorded', instrumentId);
}

/** Calls `fn` for every calibration recorded from now on; returns a function that stops it. */
export function onCalibrationRecorded(fn: (instrumentId: number) => void): () => void {
  emitter.on('recorded', fn);
  return () => emitter.off('recorded', fn);
}
