import type { StageReadings } from '../interpretation/reduction';
import type { TestRecord } from './schema';

/** The record's stages as the interpretation methods take them: gauge settlements in the order of `record.gauges`. */
export function toStageReadings(record: TestRecord): StageReadings[] {
  const keys = record.gauges.map((g) => g.key);
  return record.stages.map((stage) => ({
    index: stage.index,
    branch: stage.branch,
    targetKpa: stage.targetKpa,
    readings: stage.readings.map((r) => ({ tMin: r.tMin, pressureKpa: r.pressureKpa, gauges: keys.map((k) => r.gauges[k]) })),
  }));
}

/** Number of readings in the record. */
export function readingCount(record: Pick<TestRecord, 'stages'>): number {
  return record.stages.reduce((n, s) => n + s.readings.length, 0);
}
