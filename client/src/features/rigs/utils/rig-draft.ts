import type { DeviceProfile } from '@shared/devices/schema';
import type { InstrumentKind, Rig, rigChannelInput, rigInput } from '@shared/schemas/instruments';
import type { z } from 'zod';

export type RigFormValues = z.input<typeof rigInput>;
export type ChannelRole = z.input<typeof rigChannelInput>['role'];

/** The profile id of a channel typed in by hand; the server checks profiles on serial rigs only. */
export const MANUAL_PROFILE = 'manual';

/** Which kind of registered instrument can serve each channel role. */
export const KIND_FOR_ROLE: Record<ChannelRole, InstrumentKind> = { gauge: 'gauge', pressure: 'pressure', load: 'load-cell' };

/** Displacement indicators speak ASCII; transducers and load cells speak Modbus RTU. */
export function profilesForRole(profiles: readonly DeviceProfile[], role: ChannelRole): DeviceProfile[] {
  return profiles.filter((p) => (role === 'gauge' ? p.protocol === 'ascii' : p.protocol === 'modbus-rtu'));
}

/** A gauge's position and travel before anyone has measured them: at the centre, 50 mm travel (common practice). */
export const defaultGaugeSetup = (travelMm?: number | null) => ({ xMm: 0, yMm: 0, direction: 1 as const, travelMm: travelMm ?? 50 });

export function blankChannel(role: ChannelRole, index: number): RigFormValues['channels'][number] {
  return {
    key: role === 'gauge' ? `g${index + 1}` : role === 'pressure' ? 'p1' : 'l1',
    role,
    label: '',
    instrumentId: null,
    profileId: '',
    port: '',
    gauge: role === 'gauge' ? defaultGaugeSetup() : null,
  };
}

export function blankRig(): RigFormValues {
  return { name: '', mode: 'serial', channels: [blankChannel('gauge', 0)], jackInstrumentId: null, notes: '', simulator: null };
}

/** A saved rig as the form edits it; the simulator settings ride along unchanged. */
export function rigDraft(rig: Rig): RigFormValues {
  const { name, mode, channels, jackInstrumentId, notes, simulator } = rig;
  return { name, mode, channels, jackInstrumentId, notes, simulator };
}

/** Dotted paths a server error can land on, for a rig with this many channels. */
export function rigFieldPaths(channelCount: number): string[] {
  const perChannel = ['key', 'role', 'label', 'instrumentId', 'profileId', 'port', 'gauge'];
  return [
    'name',
    'mode',
    'channels',
    'jackInstrumentId',
    'notes',
    ...Array.from({ length: channelCount }, (_, i) => perChannel.map((f) => `channels.${i}.${f}`)).flat(),
  ];
}
