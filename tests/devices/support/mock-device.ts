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
  readonly ports: SerialPortMock[] = [];
  readonly writes: Buffer[] = [];
  respond: Responder = () => undefined;

  constructor(readonly path: string) {
    SerialPortMock.binding.createPort(path);
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
