import { execFileSync } from 'node:child_process';
import { once } from 'node:events';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { holdingInt16Transducer, inputFloat32Transducer, polledMmIndicator, streamingInchIndicator } from '@shared/devices/default-profiles';
import ModbusRTU from 'modbus-serial';
import { ReadlineParser, SerialPort } from 'serialport';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseIndicatorLine } from '../../devices/ascii/parse';
import { type ControlServer, startControlServer } from '../../simulators/control';
import { RigSimulator } from '../../simulators/rig-simulator';

/*
 * A rig on real socat ptys, read from the application end with `serialport` and modbus-serial's
 * RTU client directly (an independent Modbus implementation, so CRC and framing are checked by
 * code that is not ours).
 */

function socatProcessesIn(dir: string): string[] {
  try {
    return execFileSync('pgrep', ['-af', `socat .*${dir}`], { encoding: 'utf8' })
      .trim()
      .split('\n')
      .filter(Boolean);
  } catch {
    return []; // pgrep exits 1 when nothing matches
  }
}

/** An open app-side port of an ASCII indicator with a line reader. */
async function openIndicator(path: string) {
  const port = new SerialPort({ path, ...polledMmIndicator.serial, autoOpen: false });
  await new Promise<void>((resolve, reject) => port.open((error) => (error ? reject(error) : resolve())));
  const lines = port.pipe(new ReadlineParser({ delimiter: polledMmIndicator.terminator, encoding: 'latin1' }));
  const poll = (timeoutMs = 1000) =>
    new Promise<string | undefined>((resolve) => {
      const timer = setTimeout(() => {
        lines.off('data', onLine);
        resolve(undefined);
      }, timeoutMs);
      const onLine = (line: string) => {
        clearTimeout(timer);
        lines.off('data', onLine);
        resolve(line);
      };
      lines.on('data', onLine);
      port.write(polledMmIndicator.request);
    });
  const close = () => new Promise<void>((resolve) => (port.isOpen ? port.close(() => resolve()) : resolve()));
  return { port, poll, close };
}

const post = async (control: ControlServer, path: string, body: unknown) => {
  const response = await fetch(`${control.url}${path}`, { method: 'POST', body: JSON.stringify(body) });
  expect(response.status, await response.clone().text()).toBe(200);
  return response.json();
};

describe('rig simulator on socat ptys', () => {
  const dir = mkdtempSync(join(tmpdir(), 'settlescope-sim-'));
  let sim: RigSimulator;
  let control: ControlServer;

  beforeAll(async () => {
    sim = await RigSimulator.start({ scenario: 'dense-sand', speed: 1000, gauges: 2, dir, seed: 11 });
    control = await startControlServer(sim, { port: 0 });
  });

  afterAll(async () => {
    await control?.close();
    await sim?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('exposes one app-side pty per instrument', () => {
    expect(sim.ports.map((p) => p.id)).toEqual(['gauge-1', 'gauge-2', 'pressure']);
    for (const port of sim.ports) expect(existsSync(port.appPath)).toBe(true);
    expect(socatProcessesIn(dir)).toHaveLength(3);
  });

  it('answers a polled gauge request with one reading line the application parser accepts', async () => {
    await post(control, '/pump', { pressureKpa: 300 });
    await new Promise((resolve) => setTimeout(resolve, 200)); // 200 s of rig time at ×1000
    const gauge = await openIndicator(sim.ports[0].appPath);
    try {
      const line = await gauge.poll();
      expect(line).toMatch(/^[+-]\d{3}\.\d{3} mm$/);
      const parsed = parseIndicatorLine(polledMmIndicator, line ?? '');
      if (!parsed.ok) throw new Error(parsed.reason);
      const truth = sim.state().rig.gauges[0].readingMm;
      expect(parsed.valueMm).toBeGreaterThan(1.5); // the plate has settled under 300 kPa
      expect(Math.abs(parsed.valueMm - truth)).toBeLessThan(0.05);

      // A garbage fault spoils the next line; the parser rejects it rather than misreading it.
      await post(control, '/fault', { kind: 'garbage', durationS: 0.3, device: 'gauge-1' });
      const spoiled = await gauge.poll();
      expect(spoiled === undefined || !parseIndicatorLine(polledMmIndicator, spoiled).ok).toBe(true);
    } finally {
      await gauge.close();
    }
  });

  it('stays silent on a dropped reply', async () => {
    await post(control, '/fault', { kind: 'drop', durationS: 0.5, device: 'gauge-2' });
    const gauge = await openIndicator(sim.ports[1].appPath);
    try {
      expect(await gauge.poll(300)).toBeUndefined();
    } finally {
      await gauge.close();
    }
  });

  it('serves the oil pressure in a holding register to an independent Modbus RTU client', async () => {
    const client = new ModbusRTU();
    const { baudRate, parity, dataBits, stopBits } = holdingInt16Transducer.serial;
    await client.connectRTUBuffered(sim.ports[2].appPath, { baudRate, parity, dataBits, stopBits });
    client.setID(holdingInt16Transducer.unitId);
    client.setTimeout(1000);
    try {
      const { data } = await client.readHoldingRegisters(holdingInt16Transducer.register, 1);
      const bar = ((data[0] << 16) >> 16) * holdingInt16Transducer.scale; // int16 × 0.1 bar
      const oilBar = sim.state().rig.oilMpa * 10;
      // Noise ±0.1 % of the 40 MPa (400 bar) full scale, plus 0.1 bar steps and a little leakage.
      expect(Math.abs(bar - oilBar)).toBeLessThan(0.6);
      expect(oilBar).toBeGreaterThan(30);

      await post(control, '/fault', { kind: 'bad-crc', durationS: 5, device: 'pressure' });
      await expect(client.readHoldingRegisters(holdingInt16Transducer.register, 1)).rejects.toThrow(/CRC/i);
    } finally {
      await new Promise<void>((resolve) => client.close(() => resolve()));
    }
  });

  it('vanishes like a pulled cable and comes back on the same path', async () => {
    const gauge = await openIndicator(sim.ports[0].appPath);
    const closed = once(gauge.port, 'close');
    await post(control, '/fault', { kind: 'vanish', durationS: 0.5, device: 'gauge-1' });
    const [error] = (await closed) as [{ disconnected?: boolean } | null];
    expect(error?.disconnected).toBe(true);
    expect(existsSync(sim.ports[0].appPath)).toBe(false);

    let back: Awaited<ReturnType<typeof openIndicator>> | undefined;
    for (let attempt = 0; attempt < 40 && !back; attempt++) {
      await new Promise((resolve) => setTimeout(resolve, 100));
      back = await openIndicator(sim.ports[0].appPath).catch(() => undefined);
    }
    if (!back) throw new Error('the gauge port did not come back');
    try {
      // The link reappears a moment before the device behind it listens again, so the first
      // request may go unanswered, as with a real instrument being powered up: poll as a reader would.
      let line: string | undefined;
      for (let attempt = 0; attempt < 5 && line === undefined; attempt++) line = await back.poll(300);
      expect(parseIndicatorLine(polledMmIndicator, line ?? '').ok).toBe(true);
    } finally {
      await back.close();
    }
  }, 15_000);

  it('stops cleanly: links removed and no socat left behind', async () => {
    const paths = sim.ports.flatMap((p) => [p.appPath, p.devicePath]);
    await sim.stop();
    for (const path of paths) expect(existsSync(path)).toBe(false);
    expect(socatProcessesIn(dir)).toEqual([]);
  });
});

describe('streaming indicator and float32 input registers on socat ptys', () => {
  const dir = mkdtempSync(join(tmpdir(), 'settlescope-sim-'));
  let sim: RigSimulator;

  beforeAll(async () => {
    sim = await RigSimulator.start({
      scenario: 'compacted-fill',
      speed: 100,
      gauges: 1,
      dir,
      seed: 5,
      gaugeProfile: streamingInchIndicator,
      pressureProfile: inputFloat32Transducer,
    });
    sim.rig.pumpToOil(4);
  });

  afterAll(async () => {
    await sim?.stop();
    expect(socatProcessesIn(dir)).toEqual([]);
    rmSync(dir, { recursive: true, force: true });
  });

  it('streams inch lines at the profile rate without being asked', async () => {
    const { serial, terminator, pollIntervalMs } = streamingInchIndicator;
    const port = new SerialPort({ path: sim.ports[0].appPath, ...serial, autoOpen: false });
    await new Promise<void>((resolve, reject) => port.open((error) => (error ? reject(error) : resolve())));
    const lines: string[] = [];
    port.pipe(new ReadlineParser({ delimiter: terminator, encoding: 'latin1' })).on('data', (line: string) => lines.push(line));
    await new Promise((resolve) => setTimeout(resolve, pollIntervalMs * 5.5));
    await new Promise<void>((resolve) => port.close(() => resolve()));
    expect(lines.length).toBeGreaterThanOrEqual(3);
    expect(lines.length).toBeLessThanOrEqual(7);
    for (const line of lines) expect(parseIndicatorLine(streamingInchIndicator, line).ok).toBe(true);
  });

  it('serves a float32, low word first, through function 04', async () => {
    const client = new ModbusRTU();
    const { baudRate, parity, dataBits, stopBits } = inputFloat32Transducer.serial;
    await client.connectRTUBuffered(sim.ports[1].appPath, { baudRate, parity, dataBits, stopBits });
    client.setID(inputFloat32Transducer.unitId);
    client.setTimeout(1000);
    try {
      await new Promise((resolve) => setTimeout(resolve, 100));
      const { data } = await client.readInputRegisters(inputFloat32Transducer.register, 2);
      const bytes = Buffer.alloc(4);
      bytes.writeUInt16BE(data[1], 0); // high word was sent second
      bytes.writeUInt16BE(data[0], 2);
      const mpa = bytes.readFloatBE(0);
      // ±0.1 % of the 40 MPa full scale around the jack pressure.
      expect(Math.abs(mpa - sim.state().rig.oilMpa)).toBeLessThanOrEqual(0.041);
      expect(mpa).toBeGreaterThan(1);
    } finally {
      await new Promise<void>((resolve) => client.close(() => resolve()));
    }
  });
});
