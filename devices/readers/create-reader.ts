import type { DeviceProfile } from '@shared/devices/schema';
import { AsciiIndicatorReader } from './ascii-indicator-reader';
import type { DeviceReader, DeviceReaderOptions } from './device-reader';
import { ModbusTransducerReader } from './modbus-transducer-reader';

/** The reader for a device profile: ASCII indicator or Modbus RTU transducer. */
export function createDeviceReader(profile: DeviceProfile, options: DeviceReaderOptions): DeviceReader {
  return profile.protocol === 'ascii' ? new AsciiIndicatorReader({ ...options, profile }) : new ModbusTransducerReader({ ...options, profile });
}
