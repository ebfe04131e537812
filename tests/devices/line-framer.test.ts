import { describe, expect, it } from 'vitest';
import { LineFramer } from '../../devices/ascii/line-framer';

const FIXTURE = '+012.345 mm\r\n-000.120 mm\r\n+024.999 mm\r\n';
const LINES = ['+012.345 mm', '-000.120 mm', '+024.999 mm'];

function feed(framer: LineFramer, chunks: (string | Uint8Array)[]): string[] {
  return chunks.flatMap((chunk) => framer.push(chunk));
}

describe('LineFramer', () => {
  it('yields the same lines for a split at every position of the stream', () => {
    for (let cut = 0; cut <= FIXTURE.length; cut++) {
      const lines = feed(new LineFramer({ terminator: '\r\n' }), [FIXTURE.slice(0, cut), FIXTURE.slice(cut)]);
      expect(lines, `split at ${cut}`).toEqual(LINES);
    }
  });

  it('yields the same lines for every pair of split positions (three chunks)', () => {
    for (let a = 0; a <= FIXTURE.length; a++) {
      for (let b = a; b <= FIXTURE.length; b++) {
        const chunks = [FIXTURE.slice(0, a), FIXTURE.slice(a, b), FIXTURE.slice(b)];
        expect(feed(new LineFramer({ terminator: '\r\n' }), chunks), `splits at ${a},${b}`).toEqual(LINES);
      }
    }
  });

  it('yields every line of one chunk that holds several, byte by byte as well', () => {
    expect(new LineFramer({ terminator: '\r\n' }).push(Buffer.from(FIXTURE.repeat(2)))).toEqual([...LINES, ...LINES]);
    const bytes = Buffer.from(FIXTURE);
    expect(
      feed(
        new LineFramer({ terminator: '\r\n' }),
        [...bytes].map((b) => Uint8Array.of(b)),
      ),
    ).toEqual(LINES);
  });

  it('keeps a partial line until its terminator arrives', () => {
    const framer = new LineFramer({ terminator: '\r' });
    expect(framer.push('+0.48')).toEqual([]);
    expect(framer.push('58in')).toEqual([]);
    expect(framer.push('\r+0.')).toEqual(['+0.4858in']);
  });

  it('passes noise bytes through inside the line, as latin1, for the parser to reject', () => {
    const framer = new LineFramer({ terminator: '\n' });
    expect(framer.push(Buffer.from([0x41, 0x2c, 0xff, 0x00, 0x31, 0x0a]))).toEqual(['A,\u00ff\u00001']);
  });

  it('does not take a lone CR for a CRLF terminator', () => {
    expect(new LineFramer({ terminator: '\r\n' }).push('ab\rcd\r\n')).toEqual(['ab\rcd']);
  });

  it('drops overlong garbage and the rest of that line, keeping memory bounded', () => {
    const framer = new LineFramer({ terminator: '\r\n', maxLineBytes: 16 });
    for (let i = 0; i < 1000; i++) {
      expect(framer.push('x'.repeat(100))).toEqual([]);
      expect(framer.bufferedBytes).toBeLessThanOrEqual(16 + 1);
    }
    // The tail of the garbage line must not pass for a reading, even if it looks like one.
    expect(framer.push('+012.345 mm\r\n')).toEqual([]);
    expect(framer.push('+001.000 mm\r\n')).toEqual(['+001.000 mm']);
    expect(framer.droppedBytes).toBe(100_000 + '+012.345 mm'.length);
    expect(framer.bufferedBytes).toBe(0);
  });

  it('drops a complete line longer than the limit that arrives in one chunk', () => {
    const framer = new LineFramer({ terminator: '\n', maxLineBytes: 8 });
    expect(framer.push('123456789\n12345678\n')).toEqual(['12345678']);
    expect(framer.droppedBytes).toBe(9);
  });

  it('forgets a partial line on reset', () => {
    const framer = new LineFramer({ terminator: '\r\n' });
    framer.push('+012.3');
    framer.reset();
    expect(framer.push('45 mm\r\n+001.000 mm\r\n')).toEqual(['45 mm', '+001.000 mm']);
    expect(framer.droppedBytes).toBe(6);
  });

  it('refuses an empty terminator or a bad limit, naming the option', () => {
    expect(() => new LineFramer({ terminator: '' })).toThrow(/"terminator"/);
    expect(() => new LineFramer({ terminator: '\n', maxLineBytes: 0 })).toThrow(/"maxLineBytes"/);
  });
});
