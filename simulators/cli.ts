import { realpathSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';
import { DEFAULT_DEVICE_PROFILES } from '@shared/devices/default-profiles';
import type { AsciiProfile, ModbusProfile } from '@shared/devices/schema';
import { MAX_SPEED, MIN_SPEED } from './clock';
import { type ControlServer, DEFAULT_CONTROL_PORT, startControlServer } from './control';
import { SCENARIO_IDS } from './physics/scenarios';
import { DEFAULT_PTY_DIR } from './pty';
import { RigSimulator } from './rig-simulator';

/*
 * npm run sim -- --scenario loose-sand --speed 60 [--gauges 3] [--control-port 8091] [--dir .data/pty]
 *   [--name rig] [--seed 7] [--maintain 0.02] [--gauge-profile ascii-polled-mm] [--pressure-profile modbus-hr0-int16]
 * Starts one simulated rig, prints its port paths (a JSON line, then readable lines) and runs until
 * Ctrl-C or SIGTERM, then removes its ptys and exits.
 */

const USAGE = `usage: npm run sim -- --scenario <${SCENARIO_IDS.join('|')}> [--speed ${MIN_SPEED}-${MAX_SPEED}] [--gauges 1-8]
       [--control-port ${DEFAULT_CONTROL_PORT}] [--dir ${DEFAULT_PTY_DIR}] [--name rig] [--seed N] [--maintain 0.02]
       [--gauge-profile <${profileIds('ascii').join('|')}>] [--pressure-profile <${profileIds('modbus-rtu').join('|')}>]`;

function profileIds(protocol: 'ascii' | 'modbus-rtu'): string[] {
  return DEFAULT_DEVICE_PROFILES.filter((p) => p.protocol === protocol).map((p) => p.id);
}

/** A built-in device profile of the given protocol by id; the error names the option. */
function profileOption<P extends 'ascii' | 'modbus-rtu'>(name: string, id: string | undefined, protocol: P) {
  if (id === undefined) return undefined;
  const profile = DEFAULT_DEVICE_PROFILES.find((p) => p.id === id && p.protocol === protocol);
  if (!profile) throw new TypeError(`"--${name}" must be one of ${profileIds(protocol).join(', ')} (got "${id}")`);
  return profile as P extends 'ascii' ? AsciiProfile : ModbusProfile;
}

export interface SimArgs {
  scenario: string;
  speed: number;
  gauges: number;
  controlPort: number;
  dir: string;
  name: string;
  seed?: number;
  maintain?: number;
  gaugeProfile?: AsciiProfile;
  pressureProfile?: ModbusProfile;
  /** Stop when standard input closes: the process that started the rig has gone, even by kill -9. */
  stopWithStdin?: boolean;
}

function numberOption(name: string, text: string | undefined, fallback: number | undefined, ok: (n: number) => boolean, rule: string): number | undefined {
  if (text === undefined) return fallback;
  const value = Number(text);
  if (text.trim() === '' || !Number.isFinite(value) || !ok(value)) throw new TypeError(`"--${name}" must be ${rule} (got "${text}")`);
  return value;
}

const SIM_OPTIONS = {
  scenario: { type: 'string' },
  speed: { type: 'string' },
  gauges: { type: 'string' },
  'control-port': { type: 'string' },
  dir: { type: 'string' },
  name: { type: 'string' },
  seed: { type: 'string' },
  maintain: { type: 'string' },
  'gauge-profile': { type: 'string' },
  'pressure-profile': { type: 'string' },
  'stop-with-stdin': { type: 'boolean' },
} as const;
type ParseArgsValues = ReturnType<typeof parseArgs<{ args: string[]; strict: true; allowPositionals: false; options: typeof SIM_OPTIONS }>>['values'];

/** Reads the command line; errors name the option in quotes. */
export function parseSimArgs(argv: string[]): SimArgs {
  let values: ParseArgsValues;
  try {
    ({ values } = parseArgs({ args: argv, strict: true, allowPositionals: false, options: SIM_OPTIONS }));
  } catch (error) {
    throw new TypeError((error as Error).message.replace(/'(--?[\w-]+)'/g, '"$1"'));
  }
  const scenario = values.scenario;
  if (!scenario) throw new TypeError(`"--scenario" is required; choose one of ${SCENARIO_IDS.join(', ')}`);
  if (!SCENARIO_IDS.includes(scenario)) throw new TypeError(`"--scenario" must be one of ${SCENARIO_IDS.join(', ')} (got "${scenario}")`);
  const isInt = Number.isInteger;
  return {
    scenario,
    speed: numberOption('speed', values.speed, 1, (n) => n >= MIN_SPEED && n <= MAX_SPEED, `a number from ${MIN_SPEED} to ${MAX_SPEED}`) ?? 1,
    gauges: numberOption('gauges', values.gauges, 3, (n) => isInt(n) && n >= 1 && n <= 8, 'a whole number from 1 to 8') ?? 3,
    controlPort:
      numberOption('control-port', values['control-port'], DEFAULT_CONTROL_PORT, (n) => isInt(n) && n >= 0 && n <= 65535, 'a TCP port from 0 to 65535') ??
      DEFAULT_CONTROL_PORT,
    dir: values.dir ?? DEFAULT_PTY_DIR,
    name: values.name ?? 'rig',
    seed: numberOption('seed', values.seed, undefined, (n) => isInt(n) && n >= 0, 'a whole number ≥ 0'),
    maintain: numberOption('maintain', values.maintain, undefined, (n) => n > 0 && n < 0.5, 'a fraction above 0 and below 0.5'),
    gaugeProfile: profileOption('gauge-profile', values['gauge-profile'], 'ascii'),
    pressureProfile: profileOption('pressure-profile', values['pressure-profile'], 'modbus-rtu'),
    stopWithStdin: values['stop-with-stdin'] === true,
  };
}

async function main(): Promise<void> {
  let args: SimArgs;
  try {
    args = parseSimArgs(process.argv.slice(2));
  } catch (error) {
    console.error(`error: ${(error as Error).message}\n${USAGE}`);
    process.exit(2);
  }

  const sim = await RigSimulator.start({
    scenario: args.scenario,
    speed: args.speed,
    gauges: args.gauges,
    dir: args.dir,
    name: args.name,
    seed: args.seed,
    gaugeProfile: args.gaugeProfile,
    pressureProfile: args.pressureProfile,
    rig: { maintainTolerance: args.maintain },
  });
  let control: ControlServer;
  try {
    control = await startControlServer(sim, { port: args.controlPort });
  } catch (error) {
    await sim.stop();
    throw new Error(`"--control-port" ${args.controlPort}: ${(error as Error).message}`);
  }

  console.log(JSON.stringify({ scenario: args.scenario, speed: args.speed, control: control.url, ports: sim.ports }));
  console.log(`rig simulator: ${args.scenario} at ×${args.speed}, control ${control.url}`);
  for (const port of sim.ports) console.log(`  ${port.id.padEnd(9)} ${port.appPath}  (${port.profileId})`);
  console.log('Ctrl-C stops the rig and removes its ports.');

  let stopping = false;
  const shutdown = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n${signal}: stopping the rig simulator`);
    await control.close();
    await sim.stop();
    process.exit(0);
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
  if (args.stopWithStdin) {
    process.stdin.on('end', () => void shutdown('parent gone'));
    process.stdin.resume();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(realpathSync(process.argv[1])).href) {
  main().catch((error: Error) => {
    console.error(`error: ${error.message}`);
    process.exit(1);
  });
}
