/*
 * Settlement from a displacement gauge (DOMAIN §B.1, §D.3):
 * settlement = sign × (reading − zero) + Σ reset offsets.
 */

/** How the stem moves as the plate settles. */
export type StemTravel = 'retracts' | 'extends';

/**
 * Sign that turns a reading change into settlement. Indicators count up as the stem is pushed in
 * (common practice), so a stem that retracts as the plate settles reads settlement directly; a
 * device that counts the other way says so through its profile `sign`.
 */
export function settlementSign(stem: StemTravel): 1 | -1 {
  return stem === 'retracts' ? 1 : -1;
}

/** Settlement in mm of one gauge reading. */
export function gaugeSettlementMm(readingMm: number, zeroMm: number, sign: 1 | -1, resetOffsetMm = 0): number {
  return sign * (readingMm - zeroMm) + resetOffsetMm;
}

/**
 * Offset to add when a gauge is reset under a held load (travel exhausted): the settlement it had
 * shown just before the reset, less what it shows just after, so settlement stays continuous.
 */
export function resetOffsetMm(sign: 1 | -1, beforeMm: number, afterMm: number): number {
  return sign * (beforeMm - afterMm);
}
