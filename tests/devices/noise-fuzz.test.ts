import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { AsciiProfile } from '@shared/devices/schema';
import { polledMmIndicator, statusCountsIndicator, streamingInchIndicator } from '@shared/devices/default-profiles';
import { encodeIndicatorLine } from '../../devices/ascii/encode';
import { LineFramer } from '../../devices/ascii/line-framer';
import { parseIndicatorLine } from '../../devices/ascii/parse';
import { decodeReadResponse, encodeReadResponse, type ReadRequest } from '../../devices/modbus/frames';
import { ResponseCollector } from '../../devices/modbus/response-collector';

/** True when `emitted` appears within `sent` in the same order (repeats allowed in `sent`). */
function isOrderedSubsequence(emitted: number[], sent: number[]): boolean {
  let i = 0;
  for (const value of emitted) {
    while (i < sent.length && sent[i] !== value) i++;
    if (i === sent.length) return false;
    i++;
  }
  return true;
}

/** Cuts bytes at the given positions (taken modulo the length). */
function splitAt(bytes: Uint8Array, cuts: number[]): Uint8Array[] {
  const points = [...new Set(cuts.map((c) => c % (bytes.length + 1)))].sort((a, b) => a - b);
  const chunks: Uint8Array[] = [];
  let start = 0;
  for (const p of [...points, bytes.length]) {
    chunks.push(bytes.subarray(start, p));
    start = p;
  }
  return chunks;
}

const profiles: [AsciiProfile, number][] = [
  [polledMmIndicator, 999],
  [streamingInchIndicator, 250],
  [statusCountsIndicator, 4999],
];

/** Noise between frames: random bytes, or the head or tail of some frame (a line cut short). */
const noiseFor = (profile: AsciiProfile) =>
  fc.oneof(
    fc.uint8Array({ maxLength: 24 }),
    fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.nat()).map(([v, n]) => {
      const frame = Buffer.from(encodeIndicatorLine(profile, v), 'latin1');
      return frame.subarray(0, n % frame.length); // never the whole frame
    }),
    fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.nat()).map(([v, n]) => {
      const frame = Buffer.from(encodeIndicatorLine(profile, v), 'latin1');
      return frame.subarray(1 + (n % (frame.length - 1))); // never the whole frame
    }),
  );

describe('ASCII framing and parsing under noise (QUALITY R5)', () => {
  // ASCII lines carry no checksum, so what this can promise is bounded. The fixed-width patterns
  // make any terminator-free noise inside a frame, and any noise or fragment glued to a frame, fail
  // the pattern. Noise that carries a terminator *into* a frame can splice onto its head and forge
  // a reading ("+0" + "\r+1" + ".0000in" reads "+1.0000in"), as can bytes lost mid-line; no
  // checksum-free format can detect that, so such noise is kept between frames here.
  const soup = fc.uint8Array({ minLength: 1, maxLength: 12 }).map((bytes) => bytes.filter((b) => b !== 0x0d && b !== 0x0a));

  it.each(profiles)('%#: every emitted value was sent, in order, whatever the noise and splits', (profile, max) => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            mm: fc.double({ min: -max, max, noNaN: true }),
            noise: fc.option(noiseFor(profile), { freq: 2 }),
            soup: fc.option(soup, { freq: 2 }),
            at: fc.nat(),
          }),
          { minLength: 1, maxLength: 25 },
        ),
        fc.array(fc.nat(), { maxLength: 30 }),
        (frames, cuts) => {
          const sent: number[] = [];
          const parts: Buffer[] = [];
          for (const { mm, noise, soup, at } of frames) {
            const frame = Buffer.from(encodeIndicatorLine(profile, mm), 'latin1');
            const parsed = parseIndicatorLine(profile, frame.subarray(0, -profile.terminator.length).toString('latin1'));
            if (!parsed.ok) throw new Error('encoder produced an unreadable frame');
            sent.push(parsed.valueMm);
            const pos = 1 + (at % (frame.length - 1)); // terminator-free bytes land strictly inside the frame
            parts.push(Buffer.from(noise ?? []), frame.subarray(0, pos), Buffer.from(soup ?? []), frame.subarray(pos));
          }
          const framer = new LineFramer({ terminator: profile.terminator, maxLineBytes: 64 });
          const emitted = splitAt(Buffer.concat(parts), cuts)
            .flatMap((chunk) => framer.push(chunk))
            .map((line) => parseIndicatorLine(profile, line))
            .flatMap((r) => (r.ok ? [r.valueMm] : []));
          expect(isOrderedSubsequence(emitted, sent)).toBe(true);
          const clean = frames.every((f) => !f.noise && !f.soup?.length);
          if (clean) expect(emitted).toEqual(sent);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('random byte soup alone yields no reading', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 400 }), fc.array(fc.nat(), { maxLength: 10 }), (soup, cuts) => {
        for (const [profile] of profiles) {
          const framer = new LineFramer({ terminator: profile.terminator });
          const lines = splitAt(soup, cuts).flatMap((chunk) => framer.push(chunk));
          expect(lines.filter((line) => parseIndicatorLine(profile, line).ok)).toEqual([]);
        }
      }),
      { numRuns: 500 },
    );
  });
});

describe('Modbus reply collection under noise (QUALITY R5)', () => {
  const request: ReadRequest = { unitId: 7, functionCode: 3, address: 0, quantity: 2 };

  it('takes only the reply that was sent, or nothing, whatever the noise, corruption and splits', () => {
    fc.assert(
      fc.property(
        fc.tuple(fc.integer({ min: 0, max: 0xffff }), fc.integer({ min: 0, max: 0xffff })),
        fc.uint8Array({ maxLength: 40 }),
        fc.uint8Array({ maxLength: 40 }),
        fc.option(fc.tuple(fc.nat(), fc.integer({ min: 1, max: 255 }))),
        fc.array(fc.nat(), { maxLength: 12 }),
        (registers, before, after, corruption, cuts) => {
          const frame = encodeReadResponse(request.unitId, request.functionCode, registers);
          if (corruption) frame[corruption[0] % frame.length] ^= corruption[1];
          const collector = new ResponseCollector();
          collector.begin(request);
          let taken: Uint8Array | undefined;
          for (const chunk of splitAt(Uint8Array.from([...before, ...frame, ...after]), cuts)) {
            taken ??= collector.push(chunk);
          }
          const decoded = taken && decodeReadResponse(taken, request);
          if (corruption) {
            // A damaged reply is never taken for a reading (CRC-16 catches any single-byte error).
            expect(decoded?.ok ? decoded.registers : undefined).not.toEqual(expect.anything());
          } else {
            // An intact reply is always found behind the noise, and it is the one sent (noise could
            // hold a complete valid reply only with negligible probability).
            expect(decoded).toEqual({ ok: true, registers });
          }
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('keeps at most one maximal frame of garbage', () => {
    const collector = new ResponseCollector();
    collector.begin(request);
    for (let i = 0; i < 100; i++) collector.push(new Uint8Array(100).fill(0xaa));
    expect(collector.received.length).toBeLessThanOrEqual(256);
    expect(collector.noiseBytes).toBe(100 * 100 - collector.received.length);
  });
});
