import type { Calibration } from '../../shared/calibration/schema';
import type { KitInstrument } from '../../shared/hold/instrument-alarms';
import { calibrationStatus, todayUtc } from '../../shared/instruments/status';
import type { PlannedStage } from '../../shared/plans/stages';
import type { CalibrationVersion, RunSetupSnapshot } from '../../shared/runs/measurement-model';
import type { PlanInput } from '../../shared/schemas/plans';
import type { CalibrationStatus, Rig as RigDto } from '../../shared/schemas/instruments';
import { notFound } from '../http/errors';
import { CalibrationRecord } from '../models/calibration-record';
import { Instrument } from '../models/instrument';
import { Rig } from '../models/rig';
import type { InstrumentRange } from '../../shared/devices/range';
import { refreshLabProfiles } from './device-profiles';
import { channelUnit } from './rig-connection';

/** A rig with what reading it needs: the calibration in force and its status, per instrument. */
export interface RigContext {
  rig: RigDto;
  calibrations: Map<number, Calibration>;
  /** Id of the calibration record in force, per instrument. */
  calibrationIds: Map<number, number>;
  status: Map<number, CalibrationStatus>;
  serials: Map<number, string>;
  /** The register's range of each instrument (readings outside it are rejected). */
  ranges?: Map<number, InstrumentRange>;
  /** What the register says of each instrument: resolution, travel, calibration and its due date. */
  kit?: Map<number, KitInstrument>;
  jack: { calibration: Calibration | null; serial: string; status: CalibrationStatus; ratedPressureMpa?: number | null } | null;
}

/**
 * The rig as it stands, with each instrument's calibration in force. `asOf`: only calibrations recorded
 * by then count (a run created before this program kept set-up snapshots is measured with the
 * calibrations it could have used, not with later ones).
 */
export async function loadRigContext(rigId: number, asOf?: Date): Promise<RigContext> {
  const rig = await Rig.findByPk(rigId);
  if (!rig) throw notFound('Rig');
  await refreshLabProfiles(); // the channels may name profiles the lab defined or changed since
  const ids = [...rig.channels.map((c) => c.instrumentId).filter((id): id is number => id != null), ...(rig.jackInstrumentId ? [rig.jackInstrumentId] : [])];
  const instruments = ids.length ? await Instrument.findAll({ where: { id: ids }, include: [{ model: CalibrationRecord, as: 'calibrations' }] }) : [];
  const today = todayUtc();
  const calibrations = new Map<number, Calibration>();
  const calibrationIds = new Map<number, number>();
  const status = new Map<number, CalibrationStatus>();
  const serials = new Map<number, string>();
  const kit = new Map<number, KitInstrument>();
  const ranges = new Map<number, InstrumentRange>();
  for (const i of instruments) {
    ranges.set(i.id, { min: i.rangeMin, max: i.rangeMax, unit: i.unit });
    if (asOf) i.calibrations = (i.calibrations ?? []).filter((c) => c.createdAt.getTime() <= asOf.getTime());
    const current = i.currentCalibration();
    if (current) {
      calibrations.set(i.id, current.method);
      calibrationIds.set(i.id, current.id);
    }
    status.set(i.id, calibrationStatus(current?.dueOn, today));
    serials.set(i.id, i.serialNumber);
    kit.set(i.id, { serial: i.serialNumber, resolution: i.resolution, travelMm: i.travelMm, calibration: current?.method ?? null, dueOn: current?.dueOn ?? null });
  }
  const jackId = rig.jackInstrumentId;
  const ratedPressureMpa = instruments.find((i) => i.id === jackId)?.ratedPressureMpa ?? null;
  const jack = jackId ? { calibration: calibrations.get(jackId) ?? null, serial: serials.get(jackId) ?? '?', status: status.get(jackId) ?? 'uncalibrated', ratedPressureMpa } : null;
  return { rig: rig.toDto(), calibrations, calibrationIds, status, serials, kit, ranges, jack };
}

/** The version of an instrument's calibration the rig context holds. */
export function calibrationVersion(rig: RigContext, instrumentId: number): CalibrationVersion {
  return { instrumentId, serial: rig.serials.get(instrumentId) ?? `#${instrumentId}`, calibrationId: rig.calibrationIds.get(instrumentId) ?? null, calibration: rig.calibrations.get(instrumentId) ?? null };
}

/** The calibration in force for one instrument now, wherever it is fitted; null for an unknown or uncalibrated one. */
export async function currentCalibrationVersion(instrumentId: number): Promise<CalibrationVersion | null> {
  const instrument = await Instrument.findByPk(instrumentId, { include: [{ model: CalibrationRecord, as: 'calibrations' }] });
  const current = instrument?.currentCalibration();
  return instrument && current ? { instrumentId, serial: instrument.serialNumber, calibrationId: current.id, calibration: current.method } : null;
}

/** What a run on this rig measures with: taken once, when the run is created, and kept with the run. */
export function setupSnapshot(plan: PlanInput, stages: readonly PlannedStage[], rig: RigContext): RunSetupSnapshot {
  const pressureChannel = rig.rig.channels.find((c) => c.role === 'pressure');
  const ids = [...new Set([...rig.rig.channels.map((c) => c.instrumentId), rig.rig.jackInstrumentId].filter((id): id is number => id != null))];
  const jackId = rig.rig.jackInstrumentId;
  return {
    channels: structuredClone(rig.rig.channels),
    plate: { ...plan.plate },
    apparatusWeightKn: plan.apparatusWeightKn,
    stageBranches: stages.map((s) => s.branch),
    jack: jackId != null ? calibrationVersion(rig, jackId) : null,
    pressureUnit: pressureChannel ? channelUnit(pressureChannel, pressureChannel.instrumentId != null ? rig.calibrations.get(pressureChannel.instrumentId) : undefined) : null,
    instruments: ids.map((id) => calibrationVersion(rig, id)),
  };
}

/** Calibration in force per instrument id, as a snapshot (and the calibrations applied since) say. */
export function snapshotCalibrations(setup: RunSetupSnapshot): Map<number, Calibration> {
  const out = new Map<number, Calibration>();
  for (const v of setup.instruments) if (v.calibration) out.set(v.instrumentId, v.calibration);
  return out;
}

/**
 * The set-up a stored run measures with: its own snapshot, or for a run created before snapshots were
 * kept, its rig with the calibrations recorded by the run's creation.
 */
export async function runSnapshot(run: { rigId: number | null; createdAt: Date; state: { setup?: RunSetupSnapshot } }, plan: PlanInput, stages: readonly PlannedStage[]): Promise<RunSetupSnapshot> {
  if (run.state.setup) return run.state.setup;
  if (run.rigId === null) throw notFound('Rig of the run');
  return setupSnapshot(plan, stages, await loadRigContext(run.rigId, run.createdAt));
}
