import { plateAreaM2 } from '@shared/domain/plate';
import type { Clock } from '../clock';
import type { Random } from './random';
import type { SoilScenario } from './scenarios';
import { initialSoilState, type SoilState, soilSettlementMm, stepSoil } from './soil';

/*
 * The loading rig around the soil: a hand-pumped hydraulic jack, its oil-pressure transducer and
 * the displacement gauges on a reference beam. Operator actions are method calls; the physics is
 * stepped lazily up to the injected clock's time whenever something is read or done.
 * Parameter ranges are common practice (reference §D.1, §D.3, §G).
 */

/** The jack: force = p × A_ram × efficiency; seal friction makes rising and falling branches differ. */
export interface JackOptions {
  /** Ram area, mm². Defaults to 5027 (80 mm ram, ≈ 350 kN at 70 MPa). */
  ramAreaMm2?: number;
  /** Efficiency on a rising pressure. Defaults to 0.98. */
  efficiencyRising?: number;
  /** Efficiency on a falling pressure. Defaults to 1.01. */
  efficiencyFalling?: number;
  /** Highest oil pressure the jack takes, MPa. Defaults to 70 (700 bar). */
  maxPressureMpa?: number;
}

/** One displacement gauge on the reference beam. */
export interface GaugeOptions {
  /** Travel to the hard stop, mm. Defaults to 25. */
  travelMm?: number;
  /** Resolution (one count), mm: 0.01 or 0.001. Defaults to 0.01. */
  resolutionMm?: number;
  /** Reading right after mounting or re-seating, mm. Defaults to 1. */
  startMm?: number;
  /** Random noise, ± counts. Defaults to 1. */
  noiseCounts?: number;
}

export interface RigOptions {
  scenario: SoilScenario;
  clock: Clock;
  /** The gauges, evenly spaced round the plate edge (gauge 1 on the softer side). Defaults to three default gauges. */
  gauges?: GaugeOptions[];
  jack?: JackOptions;
  /** Weight of plate, ball seat and column resting on the soil, kN. Defaults to 0.5. */
  apparatusKn?: number;
  /** Oil pressure lost by seal leakage per 10 min of hold, fraction. Defaults to 0.02 (1–3 % is common practice). */
  leakPerTenMin?: number;
  /** Pressure lost per mm the plate follows the soil during a hold (reaction springs back), fraction. Defaults to 0.02. */
  followLossPerMm?: number;
  /**
   * Automatic pressure maintainer: pump back to the target whenever the oil pressure has fallen by
   * this fraction of it (useful for day-long clay holds). Defaults to off (the operator tops up).
   */
  maintainTolerance?: number;
  /** Pump rate, MPa/s. Defaults to 0.5. */
  pumpRateMpaPerS?: number;
  /** Release-valve rate, MPa/s. Defaults to 2. */
  releaseRateMpaPerS?: number;
  /** Pressure transducer full scale, MPa. Defaults to 40. */
  transducerFullScaleMpa?: number;
  /** Transducer noise, ± fraction of full scale. Defaults to 0.001 (0.1 % FS). */
  transducerNoise?: number;
  /** Source of noise. Defaults to Math.random. */
  random?: Random;
  /** Longest physics step, simulated seconds. Defaults to 1. */
  maxStepS?: number;
}

export type RigPhase = 'released' | 'pumping' | 'holding' | 'releasing';
export type JackBranch = 'rising' | 'falling';

export interface GaugeSnapshot {
  /** 1-based gauge number. */
  gauge: number;
  travelMm: number;
  resolutionMm: number;
  /** Plate movement under this gauge since the start, mm. */
  plateMm: number;
  /** What the gauge shows, noise-free, mm. */
  readingMm: number;
  atStop: boolean;
  resets: number;
}

export interface RigSnapshot {
  simTimeS: number;
  phase: RigPhase;
  branch: JackBranch;
  oilMpa: number;
  targetMpa: number;
  forceKn: number;
  platePressureKpa: number;
  /** Settlement of the plate centre since the gauges were mounted, mm. */
  settlementMm: number;
  /** Plate slope across its width (0.01 = 1:100). */
  tilt: number;
  gauges: GaugeSnapshot[];
}

interface Gauge extends Required<GaugeOptions> {
  /** Share of the centre settlement seen at this gauge's position. */
  factor: number;
  /** Local settlement when the gauge was last seated, mm. */
  seatedAtMm: number;
  resets: number;
}

const DEFAULT_JACK: Required<JackOptions> = { ramAreaMm2: 5027, efficiencyRising: 0.98, efficiencyFalling: 1.01, maxPressureMpa: 70 };
const DEFAULT_GAUGE: Required<GaugeOptions> = { travelMm: 25, resolutionMm: 0.01, startMm: 1, noiseCounts: 1 };

/** Decimal places that print a resolution exactly (0.01 → 2). */
function decimalsOf(resolutionMm: number): number {
  return Math.max(0, Math.ceil(-Math.log10(resolutionMm) - 1e-9));
}

/** A gauge's reading for a local plate movement: quantised, noisy by ± counts, and stopped at its travel. */
export function gaugeReadingMm(gauge: Required<GaugeOptions>, movedSinceSeatMm: number, noiseCounts: number): number {
  const position = Math.min(Math.max(gauge.startMm + movedSinceSeatMm, 0), gauge.travelMm);
  const maxCounts = Math.round(gauge.travelMm / gauge.resolutionMm);
  const counts = Math.min(Math.max(Math.round(position / gauge.resolutionMm) + noiseCounts, 0), maxCounts);
  return Number((counts * gauge.resolutionMm).toFixed(decimalsOf(gauge.resolutionMm)));
}

function checkPositive(value: number, field: string): number {
  if (!(Number.isFinite(value) && value > 0)) throw new RangeError(`"${field}" must be a positive number (got ${value})`);
  return value;
}

export class Rig {
  readonly scenario: SoilScenario;
  readonly jack: Required<JackOptions>;
  readonly #clock: Clock;
  readonly #random: Random;
  readonly #gauges: Gauge[];
  readonly #o: Required<Omit<RigOptions, 'scenario' | 'clock' | 'gauges' | 'jack' | 'random' | 'maintainTolerance'>>;
  #maintainTolerance: number | undefined;
  readonly #plateAreaM2: number;
  #timeMs: number;
  #soil: SoilState;
  #startMm: number;
  #oilMpa = 0;
  #targetMpa = 0;
  #phase: RigPhase = 'released';
  #branch: JackBranch = 'rising';

  constructor(options: RigOptions) {
    this.scenario = options.scenario;
    this.#clock = options.clock;
    this.#random = options.random ?? Math.random;
    this.jack = { ...DEFAULT_JACK, ...options.jack };
    this.#o = {
      apparatusKn: options.apparatusKn ?? 0.5,
      leakPerTenMin: options.leakPerTenMin ?? 0.02,
      followLossPerMm: options.followLossPerMm ?? 0.02,
      pumpRateMpaPerS: checkPositive(options.pumpRateMpaPerS ?? 0.5, 'pumpRateMpaPerS'),
      releaseRateMpaPerS: checkPositive(options.releaseRateMpaPerS ?? 2, 'releaseRateMpaPerS'),
      transducerFullScaleMpa: checkPositive(options.transducerFullScaleMpa ?? 40, 'transducerFullScaleMpa'),
      transducerNoise: options.transducerNoise ?? 0.001,
      maxStepS: checkPositive(options.maxStepS ?? 1, 'maxStepS'),
    };
    if (!(this.#o.leakPerTenMin >= 0 && this.#o.leakPerTenMin < 1)) {
      throw new RangeError(`"leakPerTenMin" must be a fraction from 0 to below 1 (got ${this.#o.leakPerTenMin})`);
    }
    this.#plateAreaM2 = plateAreaM2(this.scenario.plate);
    this.#timeMs = this.#clock.now();
    this.#soil = initialSoilState(this.scenario, this.platePressureKpa(0, 'rising'));
    this.#startMm = soilSettlementMm(this.#soil);

    const specs = options.gauges ?? [{}, {}, {}];
    if (specs.length < 1) throw new RangeError('"gauges" needs at least one gauge');
    this.#gauges = specs.map((spec, i) => {
      const gauge = { ...DEFAULT_GAUGE, ...spec };
      checkPositive(gauge.travelMm, `gauges[${i}].travelMm`);
      checkPositive(gauge.resolutionMm, `gauges[${i}].resolutionMm`);
      const angle = (2 * Math.PI * i) / specs.length;
      return { ...gauge, factor: 1 + (this.scenario.nonUniformity / 2) * Math.cos(angle), seatedAtMm: 0, resets: 0 };
    });
    this.setMaintainer(options.maintainTolerance);
  }

  // ── jack model ────────────────────────────────────────────────────────────────────────────

  /** Jack force at an oil pressure, kN (MPa × mm² = N). */
  forceKn(oilMpa: number, branch: JackBranch): number {
    const efficiency = branch === 'rising' ? this.jack.efficiencyRising : this.jack.efficiencyFalling;
    return (oilMpa * this.jack.ramAreaMm2 * efficiency) / 1000;
  }

  /** Mean pressure under the plate, kPa: jack force plus apparatus weight over the plate area. */
  platePressureKpa(oilMpa: number, branch: JackBranch): number {
    return (this.forceKn(oilMpa, branch) + this.#o.apparatusKn) / this.#plateAreaM2;
  }

  /** Oil pressure that puts a plate pressure on the soil, MPa (never below zero). */
  oilMpaFor(platePressureKpa: number, branch: JackBranch): number {
    const forceKn = platePressureKpa * this.#plateAreaM2 - this.#o.apparatusKn;
    return Math.max(0, forceKn / this.forceKn(1, branch));
  }

  // ── operator actions ──────────────────────────────────────────────────────────────────────

  /** Pump (or bleed) to an oil pressure and hold there. */
  pumpToOil(gaugeMpa: number): void {
    if (!(Number.isFinite(gaugeMpa) && gaugeMpa >= 0 && gaugeMpa <= this.jack.maxPressureMpa)) {
      throw new RangeError(`"gaugeMpa" must be from 0 to the jack's ${this.jack.maxPressureMpa} MPa (got ${gaugeMpa})`);
    }
    this.#advance();
    this.#targetMpa = gaugeMpa;
    this.#branch = gaugeMpa >= this.#oilMpa ? 'rising' : 'falling';
    this.#phase = 'pumping';
  }

  /** Pump (or bleed) to the oil pressure that puts this mean pressure on the plate. */
  pumpToPlatePressure(pressureKpa: number): void {
    if (!(Number.isFinite(pressureKpa) && pressureKpa >= 0)) {
      throw new RangeError(`"pressureKpa" must be a number ≥ 0 (got ${pressureKpa})`);
    }
    this.#advance();
    const branch = pressureKpa >= this.platePressureKpa(this.#oilMpa, this.#branch) ? 'rising' : 'falling';
    const oil = this.oilMpaFor(pressureKpa, branch);
    if (oil > this.jack.maxPressureMpa) {
      throw new RangeError(`"pressureKpa" ${pressureKpa} needs ${oil.toFixed(1)} MPa, above the jack's ${this.jack.maxPressureMpa} MPa`);
    }
    this.pumpToOil(oil);
  }

  /** Pump back up to the last target after leakage. */
  topUp(): void {
    if (this.#targetMpa === 0) throw new RangeError('"top-up" needs a pressure to return to: pump first');
    this.pumpToOil(this.#targetMpa);
  }

  /** Open the release valve: the pressure falls to zero. */
  release(): void {
    this.#advance();
    this.#targetMpa = 0;
    this.#branch = 'falling';
    if (this.#phase !== 'released') this.#phase = 'releasing';
  }

  /** Switches the automatic pressure maintainer on (tolerance as a fraction of the target) or off (undefined). */
  setMaintainer(tolerance: number | undefined): void {
    if (tolerance !== undefined && !(tolerance > 0 && tolerance < 0.5)) {
      throw new RangeError(`"maintainTolerance" must be a fraction above 0 and below 0.5 (got ${tolerance})`);
    }
    this.#advance();
    this.#maintainTolerance = tolerance;
  }

  get maintainTolerance(): number | undefined {
    return this.#maintainTolerance;
  }

  /** The operator re-seats gauge N: its reading jumps back to its start while the plate does not move. */
  resetGauge(gauge: number): void {
    const g = this.#gauge(gauge);
    this.#advance();
    g.seatedAtMm = this.#localMm(g);
    g.resets += 1;
  }

  // ── instruments ───────────────────────────────────────────────────────────────────────────

  get gaugeCount(): number {
    return this.#gauges.length;
  }

  /** What gauge N shows now: quantised, ± counts of noise, stopped at the end of its travel. */
  readGauge(gauge: number): number {
    const g = this.#gauge(gauge);
    this.#advance();
    const noise = Math.floor(this.#random() * (2 * g.noiseCounts + 1)) - g.noiseCounts;
    return gaugeReadingMm(g, this.#localMm(g) - g.seatedAtMm, noise);
  }

  /** What the oil-pressure transducer shows now, MPa, with ± `transducerNoise` of full scale. */
  readOilMpa(): number {
    this.#advance();
    const band = this.#o.transducerNoise * this.#o.transducerFullScaleMpa;
    return this.#oilMpa + (2 * this.#random() - 1) * band;
  }

  /** A load cell in the column: the jack force at the transducer's noisy pressure, kN. */
  readForceKn(): number {
    return this.forceKn(this.readOilMpa(), this.#branch);
  }

  get transducerFullScaleMpa(): number {
    return this.#o.transducerFullScaleMpa;
  }

  snapshot(): RigSnapshot {
    this.#advance();
    const settlementMm = soilSettlementMm(this.#soil) - this.#startMm;
    return {
      simTimeS: this.#timeMs / 1000,
      phase: this.#phase,
      branch: this.#branch,
      oilMpa: this.#oilMpa,
      targetMpa: this.#targetMpa,
      forceKn: this.forceKn(this.#oilMpa, this.#branch),
      platePressureKpa: this.platePressureKpa(this.#oilMpa, this.#branch),
      settlementMm,
      tilt: (this.scenario.nonUniformity * settlementMm) / this.scenario.plate.sizeMm,
      gauges: this.#gauges.map((g, i) => {
        const reading = gaugeReadingMm(g, this.#localMm(g) - g.seatedAtMm, 0);
        return {
          gauge: i + 1,
          travelMm: g.travelMm,
          resolutionMm: g.resolutionMm,
          plateMm: this.#localMm(g),
          readingMm: reading,
          atStop: reading >= g.travelMm,
          resets: g.resets,
        };
      }),
    };
  }

  // ── physics ───────────────────────────────────────────────────────────────────────────────

  #gauge(gauge: number): Gauge {
    const g = Number.isInteger(gauge) ? this.#gauges[gauge - 1] : undefined;
    if (!g) throw new RangeError(`"gauge" must be a gauge number from 1 to ${this.#gauges.length} (got ${gauge})`);
    return g;
  }

  /** Settlement under a gauge since the start, mm. */
  #localMm(g: Gauge): number {
    return (soilSettlementMm(this.#soil) - this.#startMm) * g.factor;
  }

  #advance(): void {
    const now = this.#clock.now();
    while (this.#timeMs < now) {
      const dtS = Math.min(this.#o.maxStepS, (now - this.#timeMs) / 1000);
      this.#step(dtS);
      this.#timeMs = Math.min(now, this.#timeMs + dtS * 1000);
    }
  }

  /** One step with the pressure held constant over it. */
  #step(dtS: number): void {
    const before = soilSettlementMm(this.#soil);
    this.#soil = stepSoil(this.scenario, this.#soil, this.platePressureKpa(this.#oilMpa, this.#branch), dtS);
    const followedMm = soilSettlementMm(this.#soil) - before;

    switch (this.#phase) {
      case 'pumping': {
        const gap = this.#targetMpa - this.#oilMpa;
        const reach = (gap >= 0 ? this.#o.pumpRateMpaPerS : this.#o.releaseRateMpaPerS) * dtS;
        if (Math.abs(gap) <= reach) {
          this.#oilMpa = this.#targetMpa;
          this.#phase = 'holding';
        } else {
          this.#oilMpa += Math.sign(gap) * reach;
        }
        break;
      }
      case 'holding': {
        // Seal leakage (exponential) plus the reaction springing back as the plate follows the soil.
        const leak = Math.exp((Math.log(1 - this.#o.leakPerTenMin) * dtS) / 600);
        const follow = 1 - this.#o.followLossPerMm * followedMm;
        this.#oilMpa = Math.max(0, this.#oilMpa * leak * follow);
        const tolerance = this.#maintainTolerance;
        if (tolerance !== undefined && this.#oilMpa < this.#targetMpa * (1 - tolerance)) {
          this.#phase = 'pumping';
          this.#branch = 'rising';
        }
        break;
      }
      case 'releasing': {
        this.#oilMpa = Math.max(0, this.#oilMpa - this.#o.releaseRateMpaPerS * dtS);
        if (this.#oilMpa === 0) this.#phase = 'released';
        break;
      }
      case 'released':
        break;
    }
  }
}
