import { findResponseFrame, type ReadRequest } from './frames';

/** Largest RTU frame (Serial Line guide §2.5.1): 256 bytes. */
const MAX_FRAME_BYTES = 256;

/**
 * Gathers the bytes that follow one request until they hold a CRC-valid reply to it. Noise before
 * the reply is skipped and counted; the buffer never grows past one maximal frame.
 */
export class ResponseCollector {
  private buffer = new Uint8Array(0);
  private request?: ReadRequest;
  /** Bytes discarded as noise: before a reply, beyond the bound, or with no request outstanding. */
  noiseBytes = 0;

  /** Starts collecting the reply to `request`, forgetting anything received before. */
  begin(request: ReadRequest): void {
    this.request = request;
    this.buffer = new Uint8Array(0);
  }

  /** Stops collecting (reply taken, timed out or cancelled); later bytes count as noise. */
  end(): void {
    this.request = undefined;
  }

  /** Bytes received since `begin` that did not (yet) form a reply. */
  get received(): Uint8Array {
    return this.buffer;
  }

  /** Adds a chunk; returns the reply frame once complete and valid. */
  push(chunk: Uint8Array): Uint8Array | undefined {
    if (!this.request) {
      this.noiseBytes += chunk.length;
      return undefined;
    }
    const joined = new Uint8Array(this.buffer.length + chunk.length);
    joined.set(this.buffer);
    joined.set(chunk, this.buffer.length);
    const excess = Math.max(0, joined.length - MAX_FRAME_BYTES);
    this.noiseBytes += excess;
    this.buffer = joined.subarray(excess);
    const found = findResponseFrame(this.buffer, this.request);
    if (!found) return undefined;
    this.noiseBytes += found.skipped;
    this.end();
    return found.frame;
  }
}
