/**
 * One rig's live connection: a device reader per serial channel (devices/), each sample passed
 * through the channel instrument's calibration. Everything above it (run engine, device check page)
 * sees calibrated channel readings, never bytes.
 */
import path from 'node:path';
import createDebug from 'debug';
import { type WallClock, systemClock, wallAt } from '../../devices/port/clock';
import { createDeviceReader } from '../../devices/readers/create-reader';
import type { DeviceReader } from '../../devices/readers/device-reader';
import type { DeviceStats } from '../../devices/readers/sample-channel';
import { applyCalibration } from '../../shared/calibration/evaluate';
import type { Calibration } from '../../shared/calibration/schema';
import type { DeviceProblem } from '../../shared/devices/problems';
import { type InstrumentRange, outsideInstrumentRange } from '../../shared/devices/range';
import type { DeviceSample, SampleStatus } from '../../shared/devices/schema';
import type { RigChannelInput } from '../../shared/schemas/instruments';
import { ROOT_DIR } from '../config';
import { findDeviceProfile } from './device-profiles';

export { findDeviceProfile };

const debug = createDebug('sscope:acquisition');

/** A calibrated reading of one rig channel. */
export interface ChannelReading {
  channelIndex: number;
  key: string;
  role: RigChannelInput['role'];
  /** When the sample was taken on the connection's monotonic clock, ms (for intervals: signal-lost, run time). */
  monoMs: number;
  /** Wall-clock time of the sample, ms since the epoch (for showing; converted from `monoMs`). */
  wallMs: number;
  /** The device's reading in its profile unit (mm for gauges); null when none was trusted. */
  raw: number | null;
  /** Calibrated value (mm for gauges, the transducer's pressure unit, kN for load cells); null when none. */
  value: number | null;
  status: SampleStatus;
  /** Why no value was trusted (absent when status is 'ok'). */
  problem?: DeviceProblem;
  deviceSeq: number;
}

export interface ChannelHealth extends DeviceStats {
  key: string;
  port: string;
}

/** The engineering unit a channel's calibrated value is in. */
export function channelUnit(channel: RigChannelInput, calibration: Calibration | undefined): string {
  if (calibration) return calibration.outputUnit;
  const profile = findDeviceProfile(channel.profileId);
  if (channel.role === 'gauge' || !profile) return 'mm';
  return profile.protocol === 'modbus-rtu' ? profile.unit : 'mm';
}

/** Port paths may be given relative to the project folder (the simulated rig's are). */
export const resolvePort = (port: string) => (path.isAbsolute(port) ? port : path.join(ROOT_DIR, port));

export interface RigConnectionOptions {
  channels: RigChannelInput[];
  /** Calibration in force per instrument id (absent: the device's value is taken as it is); read at every sample, so a calibration applied mid-run takes effect at once. */
  calibrations: ReadonlyMap<number, Calibration>;
  /** The register's range per instrument id: a calibrated value outside it is rejected, not passed as good. */
  ranges?: ReadonlyMap<number, InstrumentRange>;
  onReading: (reading: ChannelReading) => void;
  /** Time source of the readers and of the readings' stamps. Default: the system clock. */
  clock?: WallClock;
}

export class RigConnection {
  private readers: { key: string; port: string; reader: DeviceReader }[] = [];

  constructor(private readonly options: RigConnectionOptions) {}

  start(): void {
    this.options.channels.forEach((channel, channelIndex) => {
      const profile = findDeviceProfile(channel.profileId);
      if (!profile || !channel.port) return; // manual channel
      const clock = this.options.clock ?? systemClock;
      const port = resolvePort(channel.port);
      const reader = createDeviceReader(profile, {
        deviceId: channel.key,
        channel: channel.key,
        path: port,
        clock,
        onSample: (s) => {
          const calibration = channel.instrumentId != null ? this.options.calibrations.get(channel.instrumentId) : undefined;
          const range = channel.instrumentId != null ? this.options.ranges?.get(channel.instrumentId) : undefined;
          this.options.onReading(withinRange(toReading(s, channelIndex, channel, calibration, wallAt(clock, s.t)), channel, calibration, range));
        },
      });
      this.readers.push({ key: channel.key, port, reader });
      debug('reading %s on %s (%s)', channel.key, port, profile.id);
      reader.start();
    });
  }

  async stop(): Promise<void> {
    await Promise.all(this.readers.map((r) => r.reader.stop()));
    this.readers = [];
  }

  health(): ChannelHealth[] {
    return this.readers.map(({ key, port, reader }) => ({ key, port, ...reader.stats() }));
  }
}

function toReading(s: DeviceSample, channelIndex: number, channel: RigChannelInput, calibration: Calibration | undefined, wallMs: number): ChannelReading {
  const raw = s.status === 'ok' && s.value !== undefined ? s.value : null;
  let value: number | null = null;
  if (raw !== null) {
    try {
      value = calibration ? applyCalibration(calibration, raw) : raw;
    } catch {
      value = null; // outside what the calibration can say: never a guessed number
    }
  }
  const reading: ChannelReading = { channelIndex, key: channel.key, role: channel.role, monoMs: s.t, wallMs, raw, value: value !== null && Number.isFinite(value) ? value : null, status: raw !== null && value === null ? 'rejected' : s.status, deviceSeq: s.seq };
  if (s.problem) reading.problem = s.problem;
  else if (raw !== null && reading.value === null) reading.problem = { kind: 'value', detail: `${raw} is outside what the calibration can convert` };
  return reading;
}

/** A good reading outside the instrument's range becomes a rejected one, its device value kept and the reason named. */
function withinRange(r: ChannelReading, channel: RigChannelInput, calibration: Calibration | undefined, range: InstrumentRange | undefined): ChannelReading {
  if (!range || r.status !== 'ok' || r.value === null) return r;
  const outside = outsideInstrumentRange(r.value, channelUnit(channel, calibration), range);
  return outside ? { ...r, value: null, status: 'rejected', problem: { kind: 'outside-range', detail: outside } } : r;
}
