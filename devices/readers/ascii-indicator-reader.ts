import type { AsciiProfile } from '@shared/devices/schema';
import { LineFramer } from '../ascii/line-framer';
import { indicatorPattern, parseIndicatorLine } from '../ascii/parse';
import { DeviceReader, type DeviceReaderOptions } from './device-reader';
import { PollLoop, ReplyWaiter } from './polling';

/** Options of {@link AsciiIndicatorReader}. */
export interface AsciiIndicatorReaderOptions extends DeviceReaderOptions {
  profile: AsciiProfile;
  /** Longest line kept, bytes; longer garbage is dropped. Defaults to 256. */
  maxLineBytes?: number;
}

/**
 * A digital displacement indicator speaking one ASCII line per reading. Polled: writes the
 * profile's request every `pollIntervalMs` and waits `timeoutMs` for the answer. Streaming: takes
 * each line as it comes and reports a timeout after `timeoutMs` of silence. Values are in mm.
 */
export class AsciiIndicatorReader extends DeviceReader {
  private readonly profile: AsciiProfile;
  private readonly framer: LineFramer;
  private readonly reply = new ReplyWaiter<string>(this.clock);
  private readonly poller?: PollLoop;
  private cancelWatchdog?: () => void;

  constructor(options: AsciiIndicatorReaderOptions) {
    super(options, options.profile.serial);
    this.profile = options.profile;
    indicatorPattern(this.profile); // a bad pattern fails here, naming "pattern"
    if (this.profile.mode === 'polled' && !this.profile.request) throw new TypeError(`"request" of polled profile "${this.profile.id}" is empty`);
    this.framer = new LineFramer({ terminator: this.profile.terminator, maxLineBytes: options.maxLineBytes });
    if (this.profile.mode === 'polled') this.poller = new PollLoop(this.clock, this.profile.pollIntervalMs, () => this.poll());
  }

  protected get droppedBytes(): number {
    return this.framer.droppedBytes;
  }

  protected onData(chunk: Buffer): void {
    for (const line of this.framer.push(chunk)) {
      if (!this.poller) {
        this.armWatchdog();
        this.record(line);
      } else if (!this.reply.deliver(line)) {
        this.samples.reject(line, 'line arrived with no request pending');
      }
    }
  }

  protected onLinkUp(): void {
    this.framer.reset();
    if (this.poller) this.poller.start();
    else this.armWatchdog();
  }

  protected onLinkDown(): void {
    this.poller?.stop();
    this.reply.cancel();
    this.cancelWatchdog?.();
    this.cancelWatchdog = undefined;
  }

  private async poll(): Promise<void> {
    this.framer.reset(); // a stale half line must not prefix the answer
    const outcome = await this.ask(this.reply, this.profile.request, this.profile.timeoutMs);
    if (outcome.kind === 'reply') this.record(outcome.value);
    else if (outcome.kind === 'timeout') this.samples.timeout();
  }

  private record(line: string): void {
    const parsed = parseIndicatorLine(this.profile, line);
    if (parsed.ok) this.samples.ok(line, parsed.valueMm);
    else this.samples.reject(line, parsed.reason);
  }

  private armWatchdog(): void {
    this.cancelWatchdog?.();
    this.cancelWatchdog = this.clock.after(this.profile.timeoutMs, () => {
      this.samples.timeout();
      this.armWatchdog();
    });
  }
}
