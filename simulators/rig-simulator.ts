import { holdingInt16Transducer, polledMmIndicator } from '@shared/devices/default-profiles';
import type { AsciiProfile, ModbusProfile } from '@shared/devices/schema';
import createDebug from 'debug';
import { SimClock, type WallClock } from './clock';
import type { RigCommand } from './commands';
import { SimulatedIndicator } from './devices/ascii-indicator';
import { DevicePort } from './devices/device-port';
import { type ActiveFault, FaultBoard, type FaultKind } from './devices/faults';
import { SimulatedTransducer } from './devices/modbus-transducer';
import { seededRandom } from './physics/random';
import { type GaugeOptions, Rig, type RigOptions, type RigSnapshot } from './physics/rig';
import { type SoilScenario, scenarioById } from './physics/scenarios';
import { DEFAULT_PTY_DIR, PtyPair } from './pty';

const debug = createDebug('settlescope:simulators:rig');

/** Options of {@link RigSimulator.start}. */
export interface RigSimulatorOptions {
  /** Scenario name (see SCENARIO_IDS) or a scenario of one's own. */
  scenario: string | SoilScenario;
  /** Time-acceleration factor, ×1 to ×1000. Defaults to 1. */
  speed?: number;
  /** Number of displacement gauges, 1–8. Defaults to 3. */
  gauges?: number;
  /** Travel, resolution and noise of every gauge. Defaults to 25 mm, 0.01 mm, ±1 count. */
  gauge?: GaugeOptions;
  /** What the gauges speak. Defaults to the polled mm indicator profile. */
  gaugeProfile?: AsciiProfile;
  /** What the pressure transducer speaks. Defaults to the int16 holding-register profile. */
  pressureProfile?: ModbusProfile;
  /** Run-time folder for the pty links. Defaults to ".data/pty". */
  dir?: string;
  /** Prefix of the link names. Defaults to "rig". */
  name?: string;
  /** Seed of the instrument noise, for repeatable runs. Defaults to a random seed. */
  seed?: number;
  /** Wall clock, ms. Defaults to performance.now. */
  wall?: WallClock;
  /** Further rig settings: jack, leakage, pump rate, maintainer … */
  rig?: Omit<RigOptions, 'scenario' | 'clock' | 'gauges' | 'random'>;
}

/** One simulated instrument as the application sees it. */
export interface SimulatedPort {
  /** "gauge-1" … or "pressure". */
  id: string;
  kind: 'gauge' | 'pressure';
  /** The profile id the application must read this port with. */
  profileId: string;
  /** The path the application opens. */
  appPath: string;
  /** The path the simulated device holds. */
  devicePath: string;
}

export interface SimulatorState {
  scenario: string;
  speed: number;
  maintainTolerance: number | null;
  rig: RigSnapshot;
  ports: (SimulatedPort & { up: boolean; faults: ActiveFault[] })[];
}

interface Instrument {
  info: SimulatedPort;
  pty: PtyPair;
  port: DevicePort;
  device: SimulatedIndicator | SimulatedTransducer;
  faults: FaultBoard;
  /** Serialises vanish/return so that a stop never races a restart. */
  chain: Promise<void>;
  returnTimer?: NodeJS.Timeout;
}

const TICK_MS = 250;

/** Oil pressure (MPa) in the units a pressure profile may report. */
const PER_MPA: Record<Exclude<ModbusProfile['unit'], 'kN'>, number> = { kPa: 1000, MPa: 1, bar: 10 };

/**
 * One simulated rig: a soil scenario, the jack and gauges, and one device per instrument speaking
 * its real protocol on the device end of a socat pty pair. The application opens `ports[].appPath`.
 */
export class RigSimulator {
  readonly clock: SimClock;
  readonly rig: Rig;
  readonly ports: readonly SimulatedPort[];
  readonly #instruments: Instrument[];
  readonly #ticker: NodeJS.Timeout;
  #stopped = false;

  private constructor(clock: SimClock, rig: Rig, instruments: Instrument[]) {
    this.clock = clock;
    this.rig = rig;
    this.#instruments = instruments;
    this.ports = instruments.map((i) => i.info);
    // The physics catches up lazily on every read; a steady tick keeps that work small at ×1000
    // even when nobody reads for a while.
    this.#ticker = setInterval(() => this.rig.snapshot(), TICK_MS);
    this.#ticker.unref();
  }

  static async start(options: RigSimulatorOptions): Promise<RigSimulator> {
    const scenario = typeof options.scenario === 'string' ? scenarioById(options.scenario) : options.scenario;
    const gaugeCount = options.gauges ?? 3;
    if (!(Number.isInteger(gaugeCount) && gaugeCount >= 1 && gaugeCount <= 8)) {
      throw new RangeError(`"gauges" must be a whole number from 1 to 8 (got ${gaugeCount})`);
    }
    const wall = options.wall ?? (() => performance.now());
    const clock = new SimClock({ speed: options.speed, wall });
    const rig = new Rig({
      ...options.rig,
      scenario,
      clock,
      gauges: Array.from({ length: gaugeCount }, () => ({ ...options.gauge })),
      random: seededRandom(options.seed ?? Math.floor(Math.random() * 2 ** 32)),
    });
    const gaugeProfile = options.gaugeProfile ?? polledMmIndicator;
    const pressureProfile = options.pressureProfile ?? holdingInt16Transducer;
    const readPressure = () => (pressureProfile.unit === 'kN' ? rig.readForceKn() : rig.readOilMpa() * PER_MPA[pressureProfile.unit]);

    const place = (id: string, kind: SimulatedPort['kind'], profileId: string) => {
      const pty = new PtyPair({ name: `${options.name ?? 'rig'}-${id}`, dir: options.dir ?? DEFAULT_PTY_DIR });
      return { id, kind, profileId, appPath: pty.appPath, devicePath: pty.devicePath, pty };
    };
    const plans = [
      ...Array.from({ length: gaugeCount }, (_, i) => {
        const faults = new FaultBoard(wall);
        const device = new SimulatedIndicator({ profile: gaugeProfile, read: () => rig.readGauge(i + 1) });
        return { ...place(`gauge-${i + 1}`, 'gauge', gaugeProfile.id), faults, device, serial: gaugeProfile.serial };
      }),
      (() => {
        const faults = new FaultBoard(wall);
        const device = new SimulatedTransducer({ profile: pressureProfile, read: readPressure, faults });
        return { ...place('pressure', 'pressure', pressureProfile.id), faults, device, serial: pressureProfile.serial };
      })(),
    ];

    const instruments: Instrument[] = [];
    try {
      for (const { pty, faults, device, serial, ...info } of plans) {
        const port = new DevicePort({ path: pty.devicePath, serial, faults, onData: (chunk) => device.receive(chunk) });
        instruments.push({ info, pty, port, device, faults, chain: Promise.resolve() });
        await pty.start();
        await port.open();
        device.attach(port);
      }
    } catch (error) {
      await Promise.all(instruments.map((i) => RigSimulator.#shutDown(i)));
      throw error;
    }
    debug('started %s with %d gauges at ×%d', scenario.id, gaugeCount, clock.speed);
    return new RigSimulator(clock, rig, instruments);
  }

  /** Carries out one command and returns the state after it. */
  async apply(command: RigCommand): Promise<SimulatorState> {
    switch (command.action) {
      case 'pump':
        if (command.gaugeMpa !== undefined) this.rig.pumpToOil(command.gaugeMpa);
        else this.rig.pumpToPlatePressure(command.pressureKpa ?? 0);
        break;
      case 'top-up':
        this.rig.topUp();
        break;
      case 'release':
        this.rig.release();
        break;
      case 'gauge-reset':
        this.rig.resetGauge(command.gauge);
        break;
      case 'speed':
        this.clock.setSpeed(command.factor);
        break;
      case 'maintain':
        this.rig.setMaintainer(command.tolerance ?? undefined);
        break;
      case 'fault':
        await Promise.all(this.#select(command.device).map((i) => this.#fault(i, command.kind, command.durationS)));
        break;
    }
    return this.state();
  }

  state(): SimulatorState {
    return {
      scenario: this.rig.scenario.id,
      speed: this.clock.speed,
      maintainTolerance: this.rig.maintainTolerance ?? null,
      rig: this.rig.snapshot(),
      ports: this.#instruments.map((i) => ({ ...i.info, up: i.pty.running, faults: i.faults.list() })),
    };
  }

  /** Stops every device and socat; resolves when no socat of this rig is left. Safe to call twice. */
  async stop(): Promise<void> {
    if (this.#stopped) return;
    this.#stopped = true;
    clearInterval(this.#ticker);
    await Promise.all(this.#instruments.map((i) => RigSimulator.#shutDown(i)));
    debug('stopped');
  }

  #select(device: string | undefined): Instrument[] {
    if (device === undefined) return this.#instruments;
    const found = this.#instruments.find((i) => i.info.id === device);
    if (!found) throw new RangeError(`unknown "device" "${device}"; choose one of ${this.ports.map((p) => p.id).join(', ')}`);
    return [found];
  }

  async #fault(instrument: Instrument, kind: FaultKind, durationS: number): Promise<void> {
    instrument.faults.set(kind, durationS);
    if (kind !== 'vanish') return;
    // The cable is pulled: socat dies (the app sees its port close) and comes back on the same paths.
    clearTimeout(instrument.returnTimer);
    await RigSimulator.#enqueue(instrument, () => RigSimulator.#unplug(instrument));
    instrument.returnTimer = setTimeout(() => {
      instrument.returnTimer = undefined;
      RigSimulator.#enqueue(instrument, async () => {
        if (this.#stopped) return;
        await instrument.pty.start();
        await instrument.port.open();
        instrument.device.attach(instrument.port);
      }).catch((error: Error) => debug('%s did not come back: %s', instrument.info.id, error.message));
    }, durationS * 1000);
  }

  static #enqueue(instrument: Instrument, step: () => Promise<void>): Promise<void> {
    const next = instrument.chain.then(step);
    instrument.chain = next.catch(() => {});
    return next;
  }

  static async #unplug(instrument: Instrument): Promise<void> {
    instrument.device.detach();
    await instrument.port.close();
    await instrument.pty.stop();
  }

  static #shutDown(instrument: Instrument): Promise<void> {
    clearTimeout(instrument.returnTimer);
    return RigSimulator.#enqueue(instrument, () => RigSimulator.#unplug(instrument));
  }
}
