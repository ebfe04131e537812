import { act, renderHook } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { envelopeData, eventsUntil, runSpan, stageAt, stageSpans, stateFromReadings } from '../../../client/src/features/replay/utils/timeline';
import { usePlayback } from '../../../client/src/features/replay/utils/use-playback';
import { EVENTS, FINISHED_VIEW, READINGS_AT_25_MIN, SUMMARY } from './replay-fixtures';

describe('replay timeline', () => {
  it('finds each stage from its start to the next, with the moment its target was reached', () => {
    expect(stageSpans(EVENTS, FINISHED_VIEW.stages, 3_600_001)).toEqual([
      { stageIndex: 0, targetKpa: 7, fromMs: 0, reachedMs: 60_000, toMs: 600_000 },
      { stageIndex: 1, targetKpa: 100, fromMs: 600_000, reachedMs: 700_000, toMs: 2_000_000 },
      { stageIndex: 2, targetKpa: 200, fromMs: 2_000_000, reachedMs: 2_100_000, toMs: 3_600_000 },
    ]);
  });

  it('keeps the last stage of a running test open to now', () => {
    const spans = stageSpans(EVENTS.slice(0, 7), FINISHED_VIEW.stages, 2_050_000);
    expect(spans.at(-1)).toEqual({ stageIndex: 2, targetKpa: 200, fromMs: 2_000_000, reachedMs: null, toMs: 2_050_000 });
    expect(stageAt(spans, 1_999_999)?.stageIndex).toBe(1);
    expect(runSpan(EVENTS.slice(0, 7), undefined, 2_050_000)).toEqual({ fromMs: 0, toMs: 2_050_000 });
  });

  it('lists the events up to a time, newest first', () => {
    expect(eventsUntil(EVENTS, 900_000).map((e) => e.kind)).toEqual(['note', 'target-reached', 'stage-advanced', 'target-reached', 'run-started']);
  });

  it('measures readings with the zeros, offsets and stage in force at them, using corrections and leaving faulty readings out', () => {
    // g1 (up) zeroed at 10.00 mm, g2 (down) at 26.45 mm: 12.00 and 24.45 mm are both 2.00 mm of settlement.
    expect(stateFromReadings(FINISHED_VIEW, READINGS_AT_25_MIN)).toEqual({
      pressure: { value: 14.5, unit: 'bar' },
      // q = p·A_ram/A_plate (hydraulics, p = F/A): 14.5 bar × 100 kPa/bar × (40 mm / 150 mm)² = 103.11 kPa.
      pressureKpa: expect.closeTo(1450 * (0.04 / 0.15) ** 2, 9),
      meanSettlementMm: expect.closeTo(2, 9),
    });
    const corrected = READINGS_AT_25_MIN.map((r) => (r.channel === 0 ? { ...r, correctedValue: 12_400 } : r));
    expect(stateFromReadings(FINISHED_VIEW, corrected).meanSettlementMm).toBeCloseTo((2.4 + 2) / 2, 9);
    const faulty = READINGS_AT_25_MIN.map((r) => (r.channel === 1 ? { ...r, correctedValue: null, faulty: true } : r));
    expect(stateFromReadings(FINISHED_VIEW, faulty).meanSettlementMm).toBeNull(); // no mean from one gauge of two
  });

  it('applies a gauge reset only to the readings after it, not to the run before it', () => {
    // g1 reset at 50 min (after seq 900): read 24.00 before, 1.00 after → offset +23.00 mm (sign × (before − after)).
    const reset = { kind: 'gauge-reset', atMs: 3_000_000, payload: { channel: 'g1', beforeMm: 24, afterMm: 1, offsetMm: 23, afterSeq: 900 } };
    const view = { ...FINISHED_VIEW, measurement: { ...FINISHED_VIEW.measurement, events: [...FINISHED_VIEW.measurement.events, reset] } };
    expect(stateFromReadings(view, READINGS_AT_25_MIN).meanSettlementMm).toBeCloseTo(2, 9); // before the reset: as it was
    const after = [
      { seq: 950, tMs: 3_100_000, channel: 0, value: 1_500, status: 0 }, // 1.50 − 10.00 + 23.00 = 14.50 mm
      { seq: 951, tMs: 3_100_000, channel: 1, value: 12_450, status: 0 }, // −(12.45 − 26.45) = 14.00 mm
    ];
    expect(stateFromReadings(view, after).meanSettlementMm).toBeCloseTo((14.5 + 14) / 2, 9);
  });

  it('makes min/max envelopes of mean settlement (a downward gauge swaps its bounds) and pressure per bucket', () => {
    const [x, low, high, pLow, pHigh] = envelopeData(FINISHED_VIEW, SUMMARY);
    expect(x).toEqual([900.0005, 2700.0015]);
    // Bucket 2: g1 12.00–13.80 → 2.00–3.80 mm; g2 23.41–24.45 read downwards → 2.00–3.04 mm.
    expect(low.map((v) => v?.toFixed(4))).toEqual(['0.0000', '2.0000']);
    expect(high.map((v) => v?.toFixed(4))).toEqual(['2.0000', '3.4200']); // 3.42 = the run's live mean at its end
    expect(pLow).toEqual([0, 14.5]);
    expect(pHigh).toEqual([14.5, 28.07]);
  });
});

describe('replay playback', () => {
  afterEach(() => vi.useRealTimers());

  it('plays from the start at the chosen speed and stops at the end', () => {
    vi.useFakeTimers();
    const { result } = renderHook(() => usePlayback(1_000, 301_000));
    expect(result.current.tMs).toBe(301_000); // opens at the end: the run as it finished
    act(() => result.current.toggle()); // at the end, play starts over
    expect(result.current.tMs).toBe(1_000);
    act(() => vi.advanceTimersByTime(1000));
    expect(result.current.tMs).toBe(1_000 + 60 * 1000); // ×60 by default: one real second is a minute
    act(() => result.current.setSpeed(600));
    act(() => vi.advanceTimersByTime(1000));
    expect(result.current.tMs).toBe(301_000); // 10 min more would pass the end
    expect(result.current.playing).toBe(false);
  });
});
