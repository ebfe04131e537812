import { SerialPortMock } from 'serialport';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { asciiProfileSchema, type DeviceSample, modbusProfileSchema } from '@shared/devices/schema';
import { holdingInt16Transducer, polledMmIndicator, streamingInchIndicator } from '@shared/devices/default-profiles';
import { encodeIndicatorLine } from '../../devices/ascii/encode';
import { decodeReadRequest, encodeExceptionResponse, encodeReadRequest, encodeReadResponse } from '../../devices/modbus/frames';
import { rawForReading, valueToRegisters } from '../../devices/modbus/registers';
import { systemClock } from '../../devices/port/clock';
import { AsciiIndicatorReader } from '../../devices/readers/ascii-indicator-reader';
import { createDeviceReader } from '../../devices/readers/create-reader';
import type { DeviceReader } from '../../devices/readers/device-reader';
import { ModbusTransducerReader, hexBytes } from '../../devices/readers/modbus-transducer-reader';
import { MockDevice } from './support/mock-device';

const polled = asciiProfileSchema.parse({ ...polledMmIndicator, pollIntervalMs: 20, timeoutMs: 150 });
const streaming = asciiProfileSchema.parse({ ...streamingInchIndicator, timeoutMs: 150 });
const transducer = modbusProfileSchema.parse({ ...holdingInt16Transducer, pollIntervalMs: 20, timeoutMs: 150 });

/** A clock whose readings are distinct and known, on real timers. */
function steppingClock() {
  let t = 1000;
  return { now: () => (t += 0.5), after: systemClock.after };
}

let reader: DeviceReader | undefined;
afterEach(async () => {
  await reader?.stop();
  reader = undefined;
  MockDevice.disposeAll();
  SerialPortMock.binding.reset();
});

function start<R extends DeviceReader>(make: (onSample: (s: DeviceSample) => void) => R) {
  const samples: DeviceSample[] = [];
  const made = make((s) => samples.push(s));
  reader = made;
  made.start();
  return { reader: made, samples };
}

const common = (device: MockDevice) => ({
  deviceId: 'gauge-a',
  channel: 'gauge-1',
  path: device.path,
  createPort: device.createPort,
  clock: steppingClock(),
  backoff: { initialMs: 10, maxMs: 40 },
});

describe('AsciiIndicatorReader, polled', () => {
  it('writes the request and turns the answer into a sample in mm', async () => {
    const device = new MockDevice('/dev/poll-ok');
    device.respond = () => '+012.345 mm\r\n';
    const { samples } = start((onSample) => new AsciiIndicatorReader({ ...common(device), profile: polled, onSample }));
    await vi.waitFor(() => expect(samples.length).toBeGreaterThanOrEqual(3));
    expect(device.writes[0].toString('latin1')).toBe('?\r');
    expect(samples[0]).toEqual({ deviceId: 'gauge-a', channel: 'gauge-1', seq: 1, t: samples[0].t, raw: '+012.345 mm', value: 12.345, status: 'ok' });
    expect(samples.map((s) => s.seq)).toEqual(samples.map((_, i) => i + 1));
    expect(samples.every((s, i) => i === 0 || s.t > samples[i - 1].t)).toBe(true);
    expect(samples[0].t).toBeGreaterThan(1000);
  });

  it('assembles an answer that arrives in pieces', async () => {
    const device = new MockDevice('/dev/poll-pieces');
    device.respond = () => {
      device.emitLater('2.345 mm\r\n', 5);
      return '+01';
    };
    const { samples } = start((onSample) => new AsciiIndicatorReader({ ...common(device), profile: polled, onSample }));
    await vi.waitFor(() => expect(samples.length).toBeGreaterThanOrEqual(1));
    expect(samples[0]).toMatchObject({ status: 'ok', value: 12.345 });
  });

  it('rejects a malformed answer, counts a missing one as a timeout, and keeps one sequence', async () => {
    const device = new MockDevice('/dev/poll-mixed');
    const answers = ['+001.000 mm\r\n', 'ERR 07\r\n', undefined, '+001.500 mm\r\n'];
    let n = 0;
    device.respond = () => answers[n++ % answers.length];
    const { reader: r, samples } = start((onSample) => new AsciiIndicatorReader({ ...common(device), profile: polled, onSample }));
    await vi.waitFor(() => expect(samples.length).toBeGreaterThanOrEqual(4));
    expect(samples.slice(0, 4).map(({ status, value, raw }) => ({ status, value, raw }))).toEqual([
      { status: 'ok', value: 1, raw: '+001.000 mm' },
      { status: 'rejected', value: undefined, raw: 'ERR 07' },
      { status: 'timeout', value: undefined, raw: '' },
      { status: 'ok', value: 1.5, raw: '+001.500 mm' },
    ]);
    expect(samples.slice(0, 4).map((s) => s.seq)).toEqual([1, 2, 3, 4]);
    expect(samples[1]).not.toHaveProperty('value');
    const stats = r.stats();
    expect(stats).toMatchObject({ status: 'open', reconnects: 0, lastRejectReason: expect.stringMatching(/pattern/) });
    expect(stats.framesOk + stats.rejected + stats.timeouts).toBe(samples.length);
  });

  it('marks a vanished port with a disconnected sample, reconnects and continues the sequence', async () => {
    const device = new MockDevice('/dev/poll-vanish');
    device.respond = () => '+002.000 mm\r\n';
    const { reader: r, samples } = start((onSample) => new AsciiIndicatorReader({ ...common(device), profile: polled, onSample }));
    await vi.waitFor(() => expect(samples.length).toBeGreaterThanOrEqual(2));
    device.vanish();
    await vi.waitFor(() => expect(r.stats().status).toMatch(/error|connecting/));
    const lostAt = samples.length;
    await new Promise((resolve) => setTimeout(resolve, 100)); // away for a while: no readings, no timeouts
    expect(samples.slice(lostAt - 1).map((s) => s.status)).toEqual(['disconnected']);
    device.reappear();
    await vi.waitFor(() => expect(r.stats()).toMatchObject({ status: 'open', reconnects: 1 }));
    await vi.waitFor(() => expect(samples.length).toBeGreaterThan(lostAt + 1));
    expect(samples.at(-1)).toMatchObject({ status: 'ok', value: 2 });
    expect(samples.map((s) => s.seq)).toEqual(samples.map((_, i) => i + 1));
  });

  it('fails at construction on a bad pattern, naming it', () => {
    const device = new MockDevice('/dev/poll-bad');
    const profile = { ...polled, pattern: String.raw`(\d+)` };
    expect(() => new AsciiIndicatorReader({ ...common(device), profile, onSample: () => {} })).toThrow(/"pattern"/);
  });
});

describe('AsciiIndicatorReader, streaming', () => {
  it('parses each line, rejects garbage, reports silence as a timeout and starts at nextSeq', async () => {
    const device = new MockDevice('/dev/stream');
    const { reader: r, samples } = start((onSample) => new AsciiIndicatorReader({ ...common(device), profile: streaming, nextSeq: 1000, onSample }));
    await vi.waitFor(() => expect(r.stats().status).toBe('open'));
    device.emit(`${encodeIndicatorLine(streaming, 12.7)}+0.50`);
    device.emit(`00in\r#garbage\r`);
    await vi.waitFor(() => expect(samples.length).toBeGreaterThanOrEqual(4));
    expect(samples.slice(0, 4).map(({ seq, status, value }) => ({ seq, status, value }))).toEqual([
      { seq: 1000, status: 'ok', value: 12.7 },
      { seq: 1001, status: 'ok', value: 12.7 },
      { seq: 1002, status: 'rejected', value: undefined },
      { seq: 1003, status: 'timeout', value: undefined },
    ]);
  });

  it('with 10 % malformed and split lines, records every good value exactly and rejects the rest (QUALITY R5)', async () => {
    const device = new MockDevice('/dev/stream-noise');
    const { reader: r, samples } = start((onSample) => new AsciiIndicatorReader({ ...common(device), profile: { ...streaming, timeoutMs: 5000 }, onSample }));
    await vi.waitFor(() => expect(r.stats().status).toBe('open'));
    const good: number[] = [];
    let stream = '';
    for (let i = 0; i < 200; i++) {
      const mm = Math.round(i * 12.345) / 100;
      const line = encodeIndicatorLine(streaming, mm);
      if (i % 10 === 3) stream += `${line.slice(0, 4)}\u0007${line.slice(4)}`;
      else {
        stream += line;
        good.push(Number((mm / 25.4).toFixed(4)) * 25.4);
      }
    }
    for (let at = 0; at < stream.length; at += 37) device.emit(Buffer.from(stream.slice(at, at + 37), 'latin1'));
    await vi.waitFor(() => expect(samples.length).toBe(200));
    expect(samples.filter((s) => s.status === 'ok').map((s) => s.value)).toEqual(good.map((v) => expect.closeTo(v, 9)));
    expect(r.stats()).toMatchObject({ framesOk: 180, rejected: 20, timeouts: 0 });
  });
});

describe('ModbusTransducerReader', () => {
  const frameFor = (bar: number) => encodeReadResponse(1, 3, valueToRegisters(rawForReading(transducer, bar), 'int16'));

  it('sends the read request and turns the reply into a value in the profile unit', async () => {
    const device = new MockDevice('/dev/mb-ok');
    device.respond = (request) => (decodeReadRequest(request).ok ? frameFor(39.3) : undefined);
    const { reader: r, samples } = start((onSample) => new ModbusTransducerReader({ ...common(device), channel: 'pressure', profile: transducer, onSample }));
    await vi.waitFor(() => expect(samples.length).toBeGreaterThanOrEqual(2));
    expect(hexBytes(device.writes[0])).toBe(hexBytes(encodeReadRequest({ unitId: 1, functionCode: 3, address: 0, quantity: 1 })));
    expect(samples[0]).toMatchObject({ channel: 'pressure', seq: 1, status: 'ok', value: expect.closeTo(39.3, 9), raw: hexBytes(frameFor(39.3)) });
    expect(r.stats().framesOk).toBe(samples.length);
  });

  it('finds the reply behind line noise and counts the noise', async () => {
    const device = new MockDevice('/dev/mb-noise');
    device.respond = () => Buffer.concat([Buffer.from([0x00, 0xff, 0x01]), frameFor(5)]);
    const { reader: r, samples } = start((onSample) => new ModbusTransducerReader({ ...common(device), profile: transducer, onSample }));
    await vi.waitFor(() => expect(samples.length).toBeGreaterThanOrEqual(1));
    expect(samples[0]).toMatchObject({ status: 'ok', value: 5 });
    expect(r.stats().droppedBytes).toBeGreaterThanOrEqual(3);
  });

  it.each([
    ['a bad CRC', () => Buffer.from(frameFor(5).map((b, i, a) => (i === a.length - 1 ? b ^ 0xff : b))), /CRC/, 'crc'],
    ['a reply from another unit', () => encodeReadResponse(9, 3, [50]), /unit 9, expected 1/, 'framing'],
    ['an exception reply', () => encodeExceptionResponse(1, 3, 2), /exception 2 \(illegal data address\)/, 'exception'],
    ['a short reply', () => frameFor(5).subarray(0, 5), /CRC|bytes/, 'crc'],
  ])('rejects %s without a value, naming the cause', async (_, reply, reason, kind) => {
    const device = new MockDevice('/dev/mb-bad');
    device.respond = () => Buffer.from(reply());
    const { reader: r, samples } = start((onSample) => new ModbusTransducerReader({ ...common(device), profile: transducer, onSample }));
    await vi.waitFor(() => expect(samples.length).toBeGreaterThanOrEqual(2));
    expect(samples.every((s) => s.status === 'rejected' && !('value' in s))).toBe(true);
    expect(samples.every((s) => s.problem?.kind === kind)).toBe(true);
    expect(r.stats()).toMatchObject({ framesOk: 0, timeouts: 0, lastRejectReason: expect.stringMatching(reason), lastProblem: { kind }, everOpened: true });
    if (kind === 'exception') expect(samples[0].problem).toEqual({ kind: 'exception', code: 2 });
  });

  it('counts silence as timeouts and reconnects after the port vanishes', async () => {
    const device = new MockDevice('/dev/mb-silent');
    const { reader: r, samples } = start((onSample) => new ModbusTransducerReader({ ...common(device), profile: transducer, onSample }));
    await vi.waitFor(() => expect(r.stats().timeouts).toBeGreaterThanOrEqual(2));
    expect(samples.every((s) => s.status === 'timeout' && s.raw === '')).toBe(true);
    device.vanish();
    await vi.waitFor(() => expect(samples.at(-1)?.status).toBe('disconnected'));
    device.reappear();
    device.respond = () => frameFor(1.5);
    await vi.waitFor(() => expect(samples.at(-1)).toMatchObject({ status: 'ok', value: 1.5 }));
    expect(r.stats().reconnects).toBe(1);
    expect(samples.map((s) => s.seq)).toEqual(samples.map((_, i) => i + 1));
  });
});

describe('createDeviceReader', () => {
  it('picks the reader by the profile protocol', () => {
    const device = new MockDevice('/dev/factory');
    const options = { ...common(device), onSample: () => {} };
    expect(createDeviceReader(polled, options)).toBeInstanceOf(AsciiIndicatorReader);
    expect(createDeviceReader(transducer, options)).toBeInstanceOf(ModbusTransducerReader);
  });
});
