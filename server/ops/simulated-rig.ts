/**
 * The demo's simulated rig: started as its own process (no production code imports the simulator),
 * its pseudo-terminal paths read from its first output line, and the "Demo rig (simulated)" record
 * pointed at them with the lab's demo instruments.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import path from 'node:path';
import { createInterface } from 'node:readline';
import type { RigInput } from '../../shared/schemas/instruments';
import { ROOT_DIR } from '../config';
import { Instrument } from '../models/instrument';
import { Rig } from '../models/rig';
import { ensureDebianPackages } from './debian';

export interface SimulatorProcess {
  child: ChildProcess;
  controlUrl: string;
  speed: number;
  ports: { id: string; kind: 'gauge' | 'pressure'; profileId: string; appPath: string }[];
  stop(): Promise<void>;
}

export interface SimulatorOptions {
  scenario: string;
  speed: number;
  gauges: number;
  controlPort: number;
  /** Folder for the pty links, relative to the project. */
  dir: string;
  name: string;
}

export async function startSimulator(o: SimulatorOptions): Promise<SimulatorProcess> {
  await ensureDebianPackages([{ binary: 'socat', pkg: 'socat' }]);
  const args = ['simulators/cli.ts', '--scenario', o.scenario, '--speed', String(o.speed), '--gauges', String(o.gauges), '--control-port', String(o.controlPort), '--dir', o.dir, '--name', o.name, '--stop-with-stdin'];
  // stdin is a pipe from us: when this process ends, even by kill -9, the simulator sees it close and stops.
  const child = spawn(process.execPath, ['--import', 'tsx', ...args], { cwd: ROOT_DIR, stdio: ['pipe', 'pipe', 'inherit'] });
  const first = await new Promise<string>((resolve, reject) => {
    const lines = createInterface({ input: child.stdout! });
    lines.once('line', resolve);
    child.once('exit', (code) => reject(new Error(`the rig simulator exited (${code}) before it started`)));
  });
  child.stdout!.resume(); // keep draining its output
  const info = JSON.parse(first) as { control: string; ports: SimulatorProcess['ports'] };
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
    });
  return { child, controlUrl: info.control, speed: o.speed, ports: info.ports, stop };
}

/** Creates or updates the demo rig record so its channels read the simulator's ports. */
export async function upsertDemoRig(sim: SimulatorProcess, name = 'Demo rig (simulated)'): Promise<Rig> {
  const serial = async (s: string) => (await Instrument.findOne({ where: { serialNumber: s } }))?.id ?? null;
  const gaugeSerials = ['DG-2107', 'DG-2108', 'DG-1733', 'DL-0412'];
  const gauges = sim.ports.filter((p) => p.kind === 'gauge');
  const radius = 130; // mm from the centre of a 300 mm plate
  const channels: RigInput['channels'] = [];
  for (const [i, p] of gauges.entries()) {
    const angle = (2 * Math.PI * i) / gauges.length;
    channels.push({
      key: `g${i + 1}`,
      role: 'gauge',
      label: `Gauge ${i + 1}`,
      instrumentId: await serial(gaugeSerials[i] ?? ''),
      profileId: p.profileId,
      port: path.relative(ROOT_DIR, p.appPath),
      gauge: { xMm: Math.round(radius * Math.cos(angle)), yMm: Math.round(radius * Math.sin(angle)), direction: 1, travelMm: 25 },
    });
  }
  const pressure = sim.ports.find((p) => p.kind === 'pressure');
  if (pressure) {
    channels.push({ key: 'p1', role: 'pressure', label: 'Jack oil pressure', instrumentId: await serial('PT-5520'), profileId: pressure.profileId, port: path.relative(ROOT_DIR, pressure.appPath), gauge: null });
  }
  const fields = {
    name,
    mode: 'serial' as const,
    channels,
    jackInstrumentId: await serial('JK-50-031'),
    notes: 'Simulated rig started by npm start; speaks the real gauge and Modbus RTU protocols over pseudo-terminals.',
    simulator: { controlUrl: sim.controlUrl, speed: sim.speed },
  };
  const existing = await Rig.findOne({ where: { name } });
  return existing ? existing.update(fields) : Rig.create(fields);
}
