/**
 * "Try it on this port": one reader with the given profile on one port for a moment, so a profile can be
 * checked against the real device before a rig names it. Ports are opened with serialport's exclusive
 * lock, so a port a rig check or a run is reading answers "never opened" with the lock error rather
 * than being shared.
 */
import { setTimeout as sleep } from 'node:timers/promises';
import { createDeviceReader } from '../../devices/readers/create-reader';
import { describeDeviceProblem } from '../../shared/devices/problems';
import type { DeviceProfile, DeviceSample, ProfilePreview } from '../../shared/devices/schema';
import { resolvePort } from './rig-connection';

export async function previewProfile(profile: DeviceProfile, port: string, durationMs: number): Promise<ProfilePreview> {
  const samples: DeviceSample[] = [];
  const path = resolvePort(port);
  // No reconnection within a preview: the first failure to open is the answer.
  const reader = createDeviceReader(profile, { deviceId: 'preview', channel: 'preview', path, onSample: (s) => samples.push(s), backoff: { initialMs: durationMs * 2, maxMs: durationMs * 2 } });
  reader.start();
  await sleep(durationMs);
  const stats = reader.stats();
  await reader.stop();
  const problem = stats.everOpened ? null : describeDeviceProblem({ kind: 'port-never-opened', detail: stats.lastError ?? 'it did not open in time' });
  return {
    port: path,
    opened: stats.everOpened,
    problem,
    samples: samples.map((s) => ({ seq: s.seq, status: s.status, raw: s.raw, value: s.value ?? null, problem: s.problem ? describeDeviceProblem(s.problem) : null })),
  };
}
