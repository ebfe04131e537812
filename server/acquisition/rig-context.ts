import type { Calibration } from '../../shared/calibration/schema';
import type { KitInstrument } from '../../shared/hold/instrument-alarms';
import { calibrationStatus, todayUtc } from '../../shared/instruments/status';
import type { CalibrationStatus, Rig as RigDto } from '../../shared/schemas/instruments';
import { notFound } from '../http/errors';
import { CalibrationRecord } from '../models/calibration-record';
import { Instrument } from '../models/instrument';
import { Rig } from '../models/rig';

/** A rig with what reading it needs: the calibration in force and its status, per instrument. */
export interface RigContext {
  rig: RigDto;
  calibrations: Map<number, Calibration>;
  status: Map<number, CalibrationStatus>;
  serials: Map<number, string>;
  /** What the register says of each instrument: resolution, travel, calibration and its due date. */
  kit?: Map<number, KitInstrument>;
  jack: { calibration: Calibration | null; serial: string; status: CalibrationStatus; ratedPressureMpa?: number | null } | null;
}

export async function loadRigContext(rigId: number): Promise<RigContext> {
  const rig = await Rig.findByPk(rigId);
  if (!rig) throw notFound('Rig');
  const ids = [...rig.channels.map((c) => c.instrumentId).filter((id): id is number => id != null), ...(rig.jackInstrumentId ? [rig.jackInstrumentId] : [])];
  const instruments = ids.length ? await Instrument.findAll({ where: { id: ids }, include: [{ model: CalibrationRecord, as: 'calibrations' }] }) : [];
  const today = todayUtc();
  const calibrations = new Map<number, Calibration>();
  const status = new Map<number, CalibrationStatus>();
  const serials = new Map<number, string>();
  const kit = new Map<number, KitInstrument>();
  for (const i of instruments) {
    const current = i.currentCalibration();
    if (current) calibrations.set(i.id, current.method);
    status.set(i.id, calibrationStatus(current?.dueOn, today));
    serials.set(i.id, i.serialNumber);
    kit.set(i.id, { serial: i.serialNumber, resolution: i.resolution, travelMm: i.travelMm, calibration: current?.method ?? null, dueOn: current?.dueOn ?? null });
  }
  const jackId = rig.jackInstrumentId;
  const ratedPressureMpa = instruments.find((i) => i.id === jackId)?.ratedPressureMpa ?? null;
  const jack = jackId ? { calibration: calibrations.get(jackId) ?? null, serial: serials.get(jackId) ?? '?', status: status.get(jackId) ?? 'uncalibrated', ratedPressureMpa } : null;
  return { rig: rig.toDto(), calibrations, status, serials, kit, jack };
}
