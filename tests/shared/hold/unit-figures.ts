import { unitPlaces } from '../../../shared/units/format';

/**
 * Every figure with a unit in `text` that carries more places than its unit shows (shared/units/format).
 * "mm/min" is tried before "mm" so a rate is not read as a length; a figure with no unit is not judged.
 */
export function overPrecise(text: string): string[] {
  return [...text.matchAll(/(-?\d+(?:\.(\d+))?)\s?(kPa|MPa|mm\/min|mm|kN|%|s)(?![a-zA-Z/])/g)].filter((m) => (m[2]?.length ?? 0) > unitPlaces(m[3])).map((m) => `${m[1]} ${m[3]}`);
}

/** How many figures with a unit `text` holds (so a test can show its pattern found something). */
export const unitFigureCount = (text: string) => [...text.matchAll(/-?\d+(?:\.\d+)?\s?(kPa|MPa|mm\/min|mm|kN|%|s)(?![a-zA-Z/])/g)].length;
