import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseSimArgs } from '../../simulators/cli';
import type { RigCommand } from '../../simulators/commands';
import { type ControlServer, startControlServer } from '../../simulators/control';
import type { SimulatorState } from '../../simulators/rig-simulator';

/** Records commands; fails the way the rig does for an impossible request. */
class RecordingRig {
  readonly commands: RigCommand[] = [];
  readonly fakeState = { scenario: 'dense-sand', speed: 1 } as SimulatorState;
  async apply(command: RigCommand): Promise<SimulatorState> {
    if (command.action === 'gauge-reset' && command.gauge > 3) throw new RangeError(`"gauge" must be a gauge number from 1 to 3 (got ${command.gauge})`);
    this.commands.push(command);
    return this.fakeState;
  }
  state(): SimulatorState {
    return this.fakeState;
  }
}

describe('control channel', () => {
  const rig = new RecordingRig();
  let server: ControlServer;

  beforeAll(async () => {
    server = await startControlServer(rig, { port: 0 });
  });
  afterAll(() => server.close());

  const post = async (path: string, body: unknown) => {
    const response = await fetch(`${server.url}${path}`, { method: 'POST', body: typeof body === 'string' ? body : JSON.stringify(body) });
    return { status: response.status, body: (await response.json()) as Record<string, unknown> };
  };

  it('listens on 127.0.0.1 only', () => {
    expect(server.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
  });

  it('turns each POST into a validated command; the route names the action', async () => {
    expect((await post('/pump', { pressureKpa: 200 })).status).toBe(200);
    expect((await post('/pump', { gaugeMpa: 2.5 })).status).toBe(200);
    expect((await post('/top-up', '')).status).toBe(200);
    expect((await post('/release', { action: 'pump' })).status).toBe(200);
    expect((await post('/gauge-reset', { gauge: 2 })).status).toBe(200);
    expect((await post('/fault', { kind: 'vanish', durationS: 5, device: 'gauge-1' })).status).toBe(200);
    expect((await post('/speed', { factor: 60 })).status).toBe(200);
    expect((await post('/maintain', { tolerance: null })).status).toBe(200);
    expect(rig.commands).toEqual([
      { action: 'pump', pressureKpa: 200 },
      { action: 'pump', gaugeMpa: 2.5 },
      { action: 'top-up' },
      { action: 'release' },
      { action: 'gauge-reset', gauge: 2 },
      { action: 'fault', kind: 'vanish', durationS: 5, device: 'gauge-1' },
      { action: 'speed', factor: 60 },
      { action: 'maintain', tolerance: null },
    ]);
  });

  it('serves GET /state', async () => {
    const response = await fetch(`${server.url}/state`);
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual(rig.fakeState);
  });

  it('rejects bad bodies with 400 and the field in quotes', async () => {
    const cases: [string, unknown, RegExp][] = [
      ['/pump', {}, /"pressureKpa" or "gaugeMpa"/],
      ['/pump', { pressureKpa: 100, gaugeMpa: 1 }, /exactly one/],
      ['/pump', { pressureKpa: -1 }, /"pressureKpa"/],
      ['/gauge-reset', { gauge: 'two' }, /"gauge"/],
      ['/gauge-reset', { gauge: 7 }, /"gauge"/],
      ['/fault', { kind: 'melt', durationS: 1 }, /"kind"/],
      ['/fault', { kind: 'drop' }, /"durationS"/],
      ['/speed', { factor: 5000 }, /"factor"/],
      ['/speed', '{not json', /not valid JSON/],
      ['/speed', [1, 2], /JSON object/],
    ];
    const before = rig.commands.length;
    for (const [path, body, message] of cases) {
      const response = await post(path, body);
      expect(response.status, `${path} ${JSON.stringify(body)}`).toBe(400);
      expect(response.body.error).toMatch(message);
    }
    expect(rig.commands.length).toBe(before);
  });

  it('answers 404 for routes it does not have', async () => {
    expect((await post('/explode', {})).status).toBe(404);
    expect((await fetch(`${server.url}/pump`)).status).toBe(404);
  });
});

describe('sim command line', () => {
  it('reads the options with their defaults', () => {
    expect(parseSimArgs(['--scenario', 'loose-sand', '--speed', '60'])).toEqual({
      scenario: 'loose-sand',
      speed: 60,
      gauges: 3,
      controlPort: 8091,
      dir: '.data/pty',
      name: 'rig',
      seed: undefined,
      maintain: undefined,
      gaugeProfile: undefined,
      pressureProfile: undefined,
      stopWithStdin: false,
    });
    expect(parseSimArgs(['--scenario', 'soft-clay', '--gauges', '4', '--control-port', '0', '--dir', '/tmp/x', '--maintain', '0.02', '--stop-with-stdin'])).toMatchObject({
      stopWithStdin: true,
      gauges: 4,
      controlPort: 0,
      dir: '/tmp/x',
      maintain: 0.02,
    });
    const profiles = parseSimArgs(['--scenario', 'dense-sand', '--gauge-profile', 'ascii-stream-inch', '--pressure-profile', 'modbus-ir2-float32']);
    expect(profiles.gaugeProfile?.id).toBe('ascii-stream-inch');
    expect(profiles.pressureProfile?.id).toBe('modbus-ir2-float32');
  });

  it('names the offending option in quotes', () => {
    expect(() => parseSimArgs([])).toThrow(/"--scenario" is required/);
    expect(() => parseSimArgs(['--scenario', 'mud'])).toThrow(/"--scenario" must be one of/);
    expect(() => parseSimArgs(['--scenario', 'dense-sand', '--speed', 'fast'])).toThrow(/"--speed"/);
    expect(() => parseSimArgs(['--scenario', 'dense-sand', '--speed', '2000'])).toThrow(/"--speed"/);
    expect(() => parseSimArgs(['--scenario', 'dense-sand', '--gauges', '2.5'])).toThrow(/"--gauges"/);
    expect(() => parseSimArgs(['--scenario', 'dense-sand', '--control-port', '70000'])).toThrow(/"--control-port"/);
    expect(() => parseSimArgs(['--scenario', 'dense-sand', '--bogus'])).toThrow(/"--bogus"/);
    // A Modbus profile is not a gauge profile.
    expect(() => parseSimArgs(['--scenario', 'dense-sand', '--gauge-profile', 'modbus-hr0-int16'])).toThrow(/"--gauge-profile" must be one of ascii-/);
    expect(() => parseSimArgs(['--scenario', 'dense-sand', '--pressure-profile', 'x'])).toThrow(/"--pressure-profile"/);
  });
});
