/**
 * The device profiles a rig channel may name: the built-in ones and those the lab defined (stored in
 * `device_profiles`). Readers are built synchronously, so the lab's profiles are held here and
 * refreshed from the database whenever a rig is loaded for reading and after every change.
 */
import { DEFAULT_DEVICE_PROFILES } from '../../shared/devices/default-profiles';
import type { DeviceProfile } from '../../shared/devices/schema';
import { DeviceProfileRecord } from '../models/device-profile';

let labProfiles: readonly DeviceProfile[] = [];

const BUILT_IN_IDS = new Set(DEFAULT_DEVICE_PROFILES.map((p) => p.id));

export const isBuiltInProfile = (id: string) => BUILT_IN_IDS.has(id);

/** Re-reads the lab's profiles from the database. */
export async function refreshLabProfiles(): Promise<readonly DeviceProfile[]> {
  labProfiles = (await DeviceProfileRecord.findAll({ order: [['profileId', 'ASC']] })).map((r) => r.toProfile());
  return labProfiles;
}

/** A profile by id, built-ins first (a lab profile can never take a built-in's id). */
export function findDeviceProfile(id: string): DeviceProfile | undefined {
  return DEFAULT_DEVICE_PROFILES.find((p) => p.id === id) ?? labProfiles.find((p) => p.id === id);
}
