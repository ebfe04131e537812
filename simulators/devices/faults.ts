import type { WallClock } from '../clock';

/**
 * Faults a simulated device can be told to show, each for a number of wall-clock seconds:
 * - garbage: random bytes before each reply or line;
 * - drop:    replies and lines are not sent;
 * - split:   each write goes out in pieces a few milliseconds apart;
 * - merge:   a write is held back and goes out together with the next one;
 * - bad-crc: Modbus replies carry a wrong CRC (ASCII devices ignore it);
 * - vanish:  the port disappears (its socat is killed) and comes back with the same paths.
 */
export const FAULT_KINDS = ['garbage', 'drop', 'split', 'merge', 'bad-crc', 'vanish'] as const;
export type FaultKind = (typeof FAULT_KINDS)[number];

export interface ActiveFault {
  kind: FaultKind;
  remainingS: number;
}

/** The faults a device shows right now; each expires by itself. */
export class FaultBoard {
  readonly #until = new Map<FaultKind, number>();
  readonly #wall: WallClock;

  constructor(wall: WallClock = () => performance.now()) {
    this.#wall = wall;
  }

  set(kind: FaultKind, durationS: number): void {
    if (!(Number.isFinite(durationS) && durationS > 0)) throw new RangeError(`"durationS" must be a positive number (got ${durationS})`);
    this.#until.set(kind, this.#wall() + durationS * 1000);
  }

  has(kind: FaultKind): boolean {
    const until = this.#until.get(kind);
    if (until === undefined) return false;
    if (until > this.#wall()) return true;
    this.#until.delete(kind);
    return false;
  }

  list(): ActiveFault[] {
    const now = this.#wall();
    return FAULT_KINDS.filter((kind) => this.has(kind)).map((kind) => ({ kind, remainingS: ((this.#until.get(kind) ?? now) - now) / 1000 }));
  }

  clear(): void {
    this.#until.clear();
  }
}
