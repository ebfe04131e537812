import { describeDeviceProblem } from '@shared/devices/problems';
import type { RigLive } from '@shared/realtime/events';
import type { CalibrationRecord, Instrument } from '@shared/schemas/instruments';

/* Invented instruments of an invented lab, for the register, rig and device check tests. */

function calibration(instrumentId: number, calibratedOn: string, dueOn: string): CalibrationRecord {
  return {
    id: instrumentId * 10,
    instrumentId,
    calibratedOn,
    dueOn,
    method: { inputUnit: 'mm', outputUnit: 'mm', curve: { kind: 'linear', c0: 0, c1: 1 } },
    notes: '',
    certificateFile: null,
    createdBy: 1,
    createdAt: `${calibratedOn}T09:00:00Z`,
  };
}

export function anInstrument(fields: Partial<Instrument> & Pick<Instrument, 'id' | 'serialNumber' | 'status'>): Instrument {
  return {
    kind: 'gauge',
    makeModel: 'Brindle DX-50 indicator',
    rangeMin: 0,
    rangeMax: 50,
    unit: 'mm',
    resolution: 0.001,
    travelMm: 50,
    ratedPressureMpa: null,
    notes: '',
    current: fields.status === 'uncalibrated' ? null : calibration(fields.id, '2025-03-01', '2026-03-01'),
    createdAt: '2025-01-01T00:00:00Z',
    updatedAt: '2025-01-01T00:00:00Z',
    ...fields,
  };
}

export const GAUGE_OK = anInstrument({ id: 1, serialNumber: 'BR-1101', status: 'in-calibration' });
export const GAUGE_OVERDUE = anInstrument({ id: 2, serialNumber: 'BR-0877', status: 'overdue', current: calibration(2, '2024-01-10', '2025-01-10') });
export const GAUGE_SOON = anInstrument({ id: 3, serialNumber: 'BR-1205', status: 'due-soon', travelMm: 30 });
export const TRANSDUCER_NEW = anInstrument({
  id: 4,
  serialNumber: 'PX-300',
  status: 'uncalibrated',
  kind: 'pressure',
  makeModel: 'Pellmark 700 bar transducer',
  rangeMax: 700,
  unit: 'bar',
  resolution: 0.1,
  travelMm: null,
});
export const JACK_OK = anInstrument({
  id: 5,
  serialNumber: 'JK-50',
  status: 'in-calibration',
  kind: 'jack',
  makeModel: 'Orrin 500 kN ram',
  rangeMax: 500,
  unit: 'kN',
  travelMm: null,
  ratedPressureMpa: 70,
});

export const REGISTER = [GAUGE_OK, GAUGE_OVERDUE, GAUGE_SOON, TRANSDUCER_NEW, JACK_OK];

/** A rig seen by the device check: two gauges and the jack pressure. */
export function aRigLive(nowMs: number, gaugeOneMm: number, problem: string | null = null): RigLive {
  return {
    rigId: 7,
    problem,
    channels: [
      {
        key: 'g1',
        label: 'North gauge',
        role: 'gauge',
        unit: 'mm',
        raw: 24690,
        value: gaugeOneMm,
        status: 'ok',
        atMs: nowMs - 200,
        port: '/dev/ttyUSB0',
        link: 'open',
        framesOk: 1520,
        rejected: 3,
        timeouts: 0,
        reconnects: 1,
        calibration: 'overdue',
        problem: null,
        lastRejection: describeDeviceProblem({ kind: 'crc' }),
      },
      {
        key: 'g2',
        label: 'South gauge',
        role: 'gauge',
        unit: 'mm',
        raw: null,
        value: null,
        status: 'timeout',
        atMs: nowMs - 9000,
        port: '/dev/ttyUSB1',
        link: 'error',
        framesOk: 0,
        rejected: 0,
        timeouts: 14,
        reconnects: 2,
        calibration: 'in-calibration',
        problem: describeDeviceProblem({ kind: 'port-lost', detail: 'No such file or directory' }),
        lastRejection: null,
      },
      {
        key: 'p1',
        label: 'Jack oil pressure',
        role: 'pressure',
        unit: 'bar',
        raw: 1234,
        value: 123.4,
        status: 'ok',
        atMs: nowMs - 100,
        port: '/dev/ttyUSB2',
        link: 'open',
        framesOk: 800,
        rejected: 0,
        timeouts: 0,
        reconnects: 0,
        calibration: 'due-soon',
        problem: null,
        lastRejection: null,
      },
    ],
  };
}
