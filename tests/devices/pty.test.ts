import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { once } from 'node:events';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ServerSerial } from 'modbus-serial';
import { SerialPort } from 'serialport';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { asciiProfileSchema, type DeviceSample, modbusProfileSchema } from '@shared/devices/schema';
import { holdingInt16Transducer, polledMmIndicator } from '@shared/devices/default-profiles';
import { encodeIndicatorLine } from '../../devices/ascii/encode';
import { LineFramer } from '../../devices/ascii/line-framer';
import { AsciiIndicatorReader } from '../../devices/readers/ascii-indicator-reader';
import type { DeviceReader } from '../../devices/readers/device-reader';
import { ModbusTransducerReader } from '../../devices/readers/modbus-transducer-reader';

/*
 * The real serial stack end to end: serialport's native binding on a socat pseudo-terminal pair,
 * a small device on the far end, and the cable pulled (socat killed) and put back (socat restarted
 * with the same links).
 */

const hasSocat = spawnSync('socat', ['-V']).status === 0;
const polled = asciiProfileSchema.parse({ ...polledMmIndicator, pollIntervalMs: 50, timeoutMs: 500 });
const transducer = modbusProfileSchema.parse({ ...holdingInt16Transducer, pollIntervalMs: 50, timeoutMs: 500 });
const backoff = { initialMs: 50, maxMs: 200 };

describe.skipIf(!hasSocat)('devices over a socat pseudo-terminal pair', () => {
  let dir = '';
  const socats = new Set<ChildProcess>();
  const cleanups: (() => Promise<unknown>)[] = [];

  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'settlescope-pty-'));
  });
  afterEach(async () => {
    for (const cleanup of cleanups.splice(0).reverse()) await cleanup().catch(() => undefined);
    for (const socat of [...socats]) await stopSocat(socat);
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  async function startSocat(a: string, b: string): Promise<ChildProcess> {
    const socat = spawn('socat', [`pty,raw,echo=0,link=${a}`, `pty,raw,echo=0,link=${b}`], { stdio: 'ignore' });
    socats.add(socat);
    await vi.waitFor(() => expect(existsSync(a) && existsSync(b)).toBe(true), { timeout: 3000, interval: 20 });
    return socat;
  }

  async function stopSocat(socat: ChildProcess): Promise<void> {
    socats.delete(socat);
    if (socat.exitCode !== null || socat.signalCode !== null) return;
    const exited = once(socat, 'exit');
    socat.kill('SIGTERM');
    await exited;
  }

  /** The far end of an ASCII indicator: answers "?" with the reading, through our own encoder. */
  function asciiDevice(path: string, readingMm: () => number): () => Promise<void> {
    const port = new SerialPort({ path, baudRate: polled.serial.baudRate });
    port.on('error', () => {});
    const framer = new LineFramer({ terminator: '\r' });
    port.on('data', (chunk: Buffer) => {
      for (const line of framer.push(chunk)) if (line === '?') port.write(encodeIndicatorLine(polled, readingMm()));
    });
    return () => new Promise<void>((resolve) => (port.isOpen ? port.close(() => resolve()) : resolve()));
  }

  /** The far end of a transducer: modbus-serial's own RTU server, an independent implementation. */
  async function modbusDevice(path: string, register0: number): Promise<() => Promise<void>> {
    const server = new ServerSerial(
      { getHoldingRegister: (address: number) => (address === 0 ? register0 : 0) },
      { path, baudRate: transducer.serial.baudRate, parity: transducer.serial.parity, unitID: transducer.unitId },
    );
    server.on('error', () => {});
    (server as unknown as { getPort(): SerialPort }).getPort().on('error', () => {}); // getPort() is untyped
    await once(server, 'initialized'); // ServerSerial announces readiness with 'initialized', not 'open'
    return () => new Promise<void>((resolve) => server.close(() => resolve()));
  }

  function startReader(make: (onSample: (s: DeviceSample) => void) => DeviceReader) {
    const samples: DeviceSample[] = [];
    const reader = make((s) => samples.push(s));
    cleanups.push(() => reader.stop());
    reader.start();
    return { reader, samples };
  }

  /** Pulls the cable and checks the loss is marked within 2 s (QUALITY R3). */
  async function pullCable(socat: ChildProcess, samples: DeviceSample[], reader: DeviceReader): Promise<void> {
    const pulledAt = performance.now();
    await stopSocat(socat);
    await vi.waitFor(() => expect(samples.at(-1)?.status).toBe('disconnected'), { timeout: 2000, interval: 10 });
    expect(performance.now() - pulledAt).toBeLessThan(2000);
    expect(reader.stats().status).not.toBe('open');
  }

  it('reads a polled ASCII indicator, marks the pulled cable and reconnects when it is back', async () => {
    const a = join(dir, 'ascii-A');
    const b = join(dir, 'ascii-B');
    let socat = await startSocat(a, b);
    let reading = 12.345;
    cleanups.push(asciiDevice(b, () => reading));
    const { reader, samples } = startReader(
      (onSample) => new AsciiIndicatorReader({ deviceId: 'g1', channel: 'gauge-1', path: a, profile: polled, backoff, onSample }),
    );

    await vi.waitFor(() => expect(samples.filter((s) => s.status === 'ok').length).toBeGreaterThanOrEqual(3), { timeout: 5000 });
    expect(samples.find((s) => s.status === 'ok')).toMatchObject({ deviceId: 'g1', raw: '+012.345 mm', value: 12.345 });

    await pullCable(socat, samples, reader);
    socat = await startSocat(a, b);
    reading = 13.5;
    cleanups.push(asciiDevice(b, () => reading));
    await vi.waitFor(() => expect(samples.at(-1)).toMatchObject({ status: 'ok', value: 13.5 }), { timeout: 5000 });
    expect(reader.stats()).toMatchObject({ status: 'open', reconnects: 1 });
    expect(samples.map((s) => s.seq)).toEqual(samples.map((_, i) => i + 1));
  }, 20_000);

  it('reads a Modbus RTU transducer served by modbus-serial, and reconnects after a pulled cable', async () => {
    const a = join(dir, 'modbus-A');
    const b = join(dir, 'modbus-B');
    let socat = await startSocat(a, b);
    cleanups.push(await modbusDevice(b, 393));
    const { reader, samples } = startReader(
      (onSample) => new ModbusTransducerReader({ deviceId: 'pt1', channel: 'pressure', path: a, profile: transducer, backoff, onSample }),
    );

    await vi.waitFor(() => expect(samples.filter((s) => s.status === 'ok').length).toBeGreaterThanOrEqual(3), { timeout: 5000 });
    const first = samples.find((s) => s.status === 'ok');
    expect(first?.value).toBeCloseTo(39.3, 9); // register 393 × 0.1 bar
    expect(first?.raw).toMatch(/^01 03 02 01 89 [0-9A-F]{2} [0-9A-F]{2}$/);

    await pullCable(socat, samples, reader);
    socat = await startSocat(a, b);
    cleanups.push(await modbusDevice(b, 0xfffb)); // −5 as int16 → −0.5 bar
    await vi.waitFor(() => expect(samples.at(-1)?.value).toBeCloseTo(-0.5, 9), { timeout: 5000 });
    expect(reader.stats()).toMatchObject({ status: 'open', reconnects: 1 });
    expect(samples.map((s) => s.seq)).toEqual(samples.map((_, i) => i + 1));
  }, 20_000);
});
