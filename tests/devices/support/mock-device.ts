import { SerialPortMock } from 'serialport';
import type { PortOpenOptions, SerialStream } from '../../../devices/port/serial-link';

type MockPortBinding = {
  write(data: Buffer): Promise<void>;
  emitData(data: Uint8Array | string): void;
  pendingRead: ((error?: Error) => void) | null;
  openOptions: Record<string, unknown>;
};

/** Answers what the reader wrote; return undefined to stay silent. */
export type Responder = (request: Buffer) => Uint8Array | string | undefined;

/**
 * A fake instrument on serialport's MockBinding, which runs the production stream code.
 * The binding comes from `SerialPortMock.binding`: an ESM import of @serialport/binding-mock
 * would be a second copy that serialport never sees.
 */
export class MockDevice {
  private static readonly all = new Set<MockDevice>();
  readonly ports: SerialPortMock[] = [];
  readonly writes: Buffer[] = [];
  respond: Responder = () => undefined;
  private readonly timers = new Set<NodeJS.Timeout>();

  constructor(readonly path: string) {
    SerialPortMock.binding.createPort(path);
    MockDevice.all.add(this);
  }

  /** Cancels every device's bytes still due, so nothing a test scheduled outlives it (call in afterEach). */
  static disposeAll(): void {
    for (const device of MockDevice.all) {
      for (const timer of device.timers) clearTimeout(timer);
      device.timers.clear();
    }
    MockDevice.all.clear();
  }

  /** Port factory for the reader under test. */
  readonly createPort = (options: PortOpenOptions): SerialStream => {
    const port = new SerialPortMock(options);
    port.on('open', () => {
      const binding = port.port as unknown as MockPortBinding;
      const write = binding.write.bind(binding);
      binding.write = async (data) => {
        await write(data);
        this.writes.push(Buffer.from(data));
        const reply = this.respond(Buffer.from(data));
        if (reply !== undefined) binding.emitData(reply);
      };
    });
    this.ports.push(port);
    return port;
  };

  get binding(): MockPortBinding {
    const port = this.ports.at(-1);
    if (!port?.isOpen) throw new Error('no open port');
    return port.port as unknown as MockPortBinding;
  }

  /** Bytes arriving from the device unasked (streaming devices, noise). */
  emit(data: Uint8Array | string): void {
    this.binding.emitData(data);
  }

  /**
   * Bytes the device sends `ms` from now on the port open now (the rest of a reply that comes in
   * pieces). Dropped if that port has closed by then, as they would be on a real line.
   */
  emitLater(data: Uint8Array | string, ms: number): void {
    const port = this.ports.at(-1);
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      if (port?.isOpen) (port.port as unknown as MockPortBinding).emitData(data);
    }, ms);
    this.timers.add(timer);
  }

  /** The cable is pulled: the pending read fails as a real binding's would, and the port is gone. */
  vanish(): void {
    const { pendingRead } = this.binding;
    if (!pendingRead) throw new Error('no read pending to fail');
    SerialPortMock.binding.reset();
    pendingRead(new Error('device unplugged'));
  }

  /** The cable is back. */
  reappear(): void {
    SerialPortMock.binding.createPort(this.path);
  }
}
