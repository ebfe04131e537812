import { requireFinite, requirePositive } from '../interpretation/input-checks';

/** +1 when the gauge's reading grows as the plate settles, −1 when it falls (stem extending). */
export type GaugeSign = 1 | -1;

/** How the stem moves as the plate settles. */
export type StemTravel = 'retracts' | 'extends';

/**
 * Sign that turns a reading change into settlement. Indicators count up as the stem is pushed in
 * (common practice), so a stem that retracts as the plate settles reads settlement directly.
 */
export function settlementSign(stem: StemTravel): GaugeSign {
  return stem === 'retracts' ? 1 : -1;
}

/**
 * Settlement seen by one gauge: sign × (reading − zero) + Σ reset offsets (reference §B.1 [CP]).
 * Offsets are in settlement terms, as {@link resetOffset} returns them.
 */
export function gaugeSettlement(rawMm: number, zeroMm: number, sign: GaugeSign, offsetsMm: readonly number[] = []): number {
  requireFinite(rawMm, 'rawMm');
  requireFinite(zeroMm, 'zeroMm');
  const offset = offsetsMm.reduce((sum, o, i) => sum + requireFinite(o, `offsetsMm[${i}]`), 0);
  return sign * (rawMm - zeroMm) + offset;
}

/**
 * Offset that keeps settlement continuous across a gauge reset read "before" and "after" under a held
 * load: sign × (before − after) (reference §C12: 24.30 before, 1.15 after → 23.15 mm).
 */
export function resetOffset(beforeMm: number, afterMm: number, sign: GaugeSign): number {
  return sign * (requireFinite(beforeMm, 'beforeMm') - requireFinite(afterMm, 'afterMm'));
}

/** A raw gauge reading and when it was taken, minutes (any clock, as long as resets use the same one). */
export interface RawGaugeReading {
  tMin: number;
  rawMm: number;
}

/** A jump between two consecutive readings that no reset accounts for. */
export interface UnmarkedJump {
  /** Index of the reading after the jump. */
  index: number;
  fromMin: number;
  toMin: number;
  /** The readings either side of the jump, mm. */
  fromMm: number;
  toMm: number;
  jumpMm: number;
  divisions: number;
}

/** Options of {@link findUnmarkedJumps}. */
export interface JumpOptions {
  /** Gauge resolution (one division), mm. Required. */
  resolutionMm: number;
  /** A change of more than this many divisions between consecutive readings is a jump. Default 100 (1 mm on a 0.01 mm dial). */
  maxDivisions?: number;
  /**
   * …and of at least this many mm. Default 0.5: a knocked or slipped gauge moves by millimetres, while a
   * plate settling after a top-up can move 0.1 mm in seconds — a hundred divisions of a 0.001 mm gauge
   * (common practice).
   */
  minJumpMm?: number;
}

// The slack keeps a change of exactly maxDivisions (1.00 mm / 0.01 mm = 100.00000000000001) unflagged.
const isJump = (changeMm: number, resolutionMm: number, maxDivisions: number, minJumpMm: number) =>
  Math.abs(changeMm) / resolutionMm > maxDivisions + 1e-9 && Math.abs(changeMm) >= minJumpMm;

/** A jump seen live between two consecutive readings of one gauge (run clock ms), kept as evidence. */
export interface GaugeJump {
  fromMs: number;
  toMs: number;
  fromMm: number;
  toMm: number;
}

/** Options of {@link jumpBetween}. */
export interface LiveJumpOptions extends JumpOptions {
  /** Readings further apart than this (run clock ms) are not compared: a change over a longer time is movement, not a knock. Default 10 s. */
  maxGapMs?: number;
}

/**
 * The jump between a gauge's previous reading and this one, or null: the live form of
 * {@link findUnmarkedJumps}, reading by reading. Whether a reset explains it is the alarm's business.
 */
export function jumpBetween(previous: { tMs: number; mm: number } | null | undefined, reading: { tMs: number; mm: number }, options: LiveJumpOptions): GaugeJump | null {
  if (!previous) return null;
  const resolution = requirePositive(options.resolutionMm, 'resolutionMm');
  const maxDivisions = requirePositive(options.maxDivisions ?? 100, 'maxDivisions');
  if (reading.tMs - previous.tMs > requirePositive(options.maxGapMs ?? 10_000, 'maxGapMs')) return null;
  return isJump(reading.mm - previous.mm, resolution, maxDivisions, options.minJumpMm ?? 0.5) ? { fromMs: previous.tMs, toMs: reading.tMs, fromMm: previous.mm, toMm: reading.mm } : null;
}

/**
 * Flags every change between consecutive raw readings larger than `maxDivisions` divisions that is not
 * marked by a reset event in (previous reading, reading] — a gauge knocked, slipped or reset without a
 * record (reference §D.3, common practice).
 */
export function findUnmarkedJumps(readings: readonly RawGaugeReading[], resetsAtMin: readonly number[], options: JumpOptions): UnmarkedJump[] {
  const resolution = requirePositive(options.resolutionMm, 'resolutionMm');
  const maxDivisions = requirePositive(options.maxDivisions ?? 100, 'maxDivisions');
  for (const [i, t] of resetsAtMin.entries()) requireFinite(t, `resetsAtMin[${i}]`);
  const jumps: UnmarkedJump[] = [];
  for (let i = 1; i < readings.length; i++) {
    const a = readings[i - 1];
    const b = readings[i];
    const jumpMm = requireFinite(b.rawMm, `readings[${i}].rawMm`) - requireFinite(a.rawMm, `readings[${i - 1}].rawMm`);
    const marked = resetsAtMin.some((t) => t > a.tMin && t <= b.tMin);
    if (isJump(jumpMm, resolution, maxDivisions, options.minJumpMm ?? 0.5) && !marked) jumps.push({ index: i, fromMin: a.tMin, toMin: b.tMin, fromMm: a.rawMm, toMm: b.rawMm, jumpMm, divisions: Math.abs(jumpMm) / resolution });
  }
  return jumps;
}
