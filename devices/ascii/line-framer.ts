/** Options of {@link LineFramer}. */
export interface LineFramerOptions {
  /** Line terminator, e.g. "\r\n" (the profile's `terminator`). */
  terminator: string;
  /**
   * Longest line kept, in bytes, terminator excluded. A longer run of bytes without a terminator is
   * garbage: it is dropped, and so is everything up to the next terminator, so that the tail of an
   * overlong line can never pass for a reading. Defaults to 256.
   */
  maxLineBytes?: number;
}

/**
 * Cuts a byte stream into complete lines. Partial data is kept between chunks; memory stays
 * bounded by `maxLineBytes` whatever arrives. Bytes are read as latin1, one character per byte,
 * so any non-ASCII noise survives into the line and makes the parser reject it.
 */
export class LineFramer {
  readonly terminator: string;
  readonly maxLineBytes: number;
  private pending = '';
  private discarding = false;
  /** Bytes thrown away as overlong garbage since construction. */
  droppedBytes = 0;

  constructor(options: LineFramerOptions) {
    if (!options.terminator) throw new TypeError('"terminator" must not be empty');
    this.terminator = options.terminator;
    this.maxLineBytes = options.maxLineBytes ?? 256;
    if (!Number.isInteger(this.maxLineBytes) || this.maxLineBytes < 1) {
      throw new TypeError('"maxLineBytes" must be a positive integer');
    }
  }

  /** Adds a chunk and returns the lines it completed, terminators removed, in order. */
  push(chunk: Uint8Array | string): string[] {
    const text = typeof chunk === 'string' ? chunk : Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength).toString('latin1');
    const data = this.pending + text;
    const lines: string[] = [];
    let start = 0;
    for (let end = data.indexOf(this.terminator); end !== -1; end = data.indexOf(this.terminator, start)) {
      const line = data.slice(start, end);
      if (this.discarding || line.length > this.maxLineBytes) {
        this.droppedBytes += line.length;
        this.discarding = false;
      } else {
        lines.push(line);
      }
      start = end + this.terminator.length;
    }
    this.pending = data.slice(start);
    this.trimPending();
    return lines;
  }

  /** Bytes of the partial line held for the next chunk. */
  get bufferedBytes(): number {
    return this.pending.length;
  }

  /** Forgets any partial line, e.g. before a new poll request. */
  reset(): void {
    this.droppedBytes += this.pending.length;
    this.pending = '';
    this.discarding = false;
  }

  private trimPending(): void {
    // Keep the last (terminator length − 1) bytes: they may be the first half of a split terminator.
    const keep = this.terminator.length - 1;
    if (this.pending.length <= this.maxLineBytes + keep) return;
    const cut = this.pending.length - keep;
    this.droppedBytes += cut;
    this.pending = this.pending.slice(cut);
    this.discarding = true;
  }
}
