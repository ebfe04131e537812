/**
 * The device check: people watching a rig's channels live (raw and calibrated value, port status,
 * error counters) before a run. The rig's ports are opened while someone watches and closed a little
 * after the last one leaves.
 */
import type { Server } from 'socket.io';
import { describeDeviceProblem } from '../../shared/devices/problems';
import type { ChannelLive, ClientToServerEvents, RigLive, ServerToClientEvents } from '../../shared/realtime/events';
import { type ChannelHealth, type ChannelReading, RigConnection, channelUnit, resolvePort } from './rig-connection';
import { type RigContext, loadRigContext } from './rig-context';

interface Monitored {
  context: RigContext;
  connection: RigConnection;
  latest: Map<string, ChannelReading>;
  /** The latest rejected reading per channel, kept while later readings are good. */
  lastRejected: Map<string, ChannelReading>;
  timer: NodeJS.Timeout;
  idleSince: number | null;
}

const EMIT_EVERY_MS = 250;
const CLOSE_AFTER_IDLE_MS = 5000;

export class RigMonitor {
  private readonly rigs = new Map<number, Monitored>();

  constructor(
    private readonly io: Server<ClientToServerEvents, ServerToClientEvents>,
    /** Says why a rig's ports are not free here (a run is using them), or null. */
    private readonly busy: (rigId: number) => string | null = () => null,
  ) {}

  room = (rigId: number) => `rig:${rigId}`;

  async open(rigId: number): Promise<void> {
    const existing = this.rigs.get(rigId);
    if (existing) {
      existing.idleSince = null;
      return;
    }
    const context = await loadRigContext(rigId);
    const latest = new Map<string, ChannelReading>();
    const lastRejected = new Map<string, ChannelReading>();
    const onReading = (r: ChannelReading) => {
      latest.set(r.key, r);
      if (r.status === 'rejected') lastRejected.set(r.key, r);
    };
    const connection = new RigConnection({ channels: context.rig.channels, calibrations: context.calibrations, ranges: context.ranges, onReading });
    const problem = this.busy(rigId);
    if (!problem) connection.start();
    const monitored: Monitored = { context, connection, latest, lastRejected, idleSince: null, timer: setInterval(() => this.tick(rigId), EMIT_EVERY_MS) };
    this.rigs.set(rigId, monitored);
  }

  snapshot(rigId: number): RigLive | null {
    const m = this.rigs.get(rigId);
    if (!m) return null;
    const health = new Map(m.connection.health().map((h) => [h.key, h]));
    const channels: ChannelLive[] = m.context.rig.channels.map((c) => {
      const r = m.latest.get(c.key);
      const h = health.get(c.key);
      const calibration = c.instrumentId == null ? 'no-instrument' : (m.context.status.get(c.instrumentId) ?? 'uncalibrated');
      return {
        key: c.key,
        label: c.label,
        role: c.role,
        unit: channelUnit(c, c.instrumentId != null ? m.context.calibrations.get(c.instrumentId) : undefined),
        raw: r?.raw ?? null,
        value: r?.value ?? null,
        status: r?.status ?? 'timeout',
        atMs: r?.wallMs ?? null,
        port: c.port ? resolvePort(c.port) : '',
        link: h?.status ?? 'manual',
        framesOk: h?.framesOk ?? 0,
        rejected: h?.rejected ?? 0,
        timeouts: h?.timeouts ?? 0,
        reconnects: h?.reconnects ?? 0,
        calibration,
        problem: currentProblem(r, h),
        lastRejection: describeReading(m.lastRejected.get(c.key)),
      };
    });
    return { rigId, channels, problem: this.busy(rigId) };
  }

  async closeAll(): Promise<void> {
    await Promise.all([...this.rigs.keys()].map((id) => this.close(id)));
  }

  private async tick(rigId: number): Promise<void> {
    const m = this.rigs.get(rigId);
    if (!m) return;
    const watchers = this.io.sockets.adapter.rooms.get(this.room(rigId))?.size ?? 0;
    if (watchers === 0) {
      m.idleSince ??= Date.now();
      if (Date.now() - m.idleSince > CLOSE_AFTER_IDLE_MS) await this.close(rigId);
      return;
    }
    m.idleSince = null;
    const live = this.snapshot(rigId);
    if (live) this.io.to(this.room(rigId)).emit('rig:live', live);
  }

  private async close(rigId: number): Promise<void> {
    const m = this.rigs.get(rigId);
    if (!m) return;
    this.rigs.delete(rigId);
    clearInterval(m.timer);
    await m.connection.stop();
  }
}

/**
 * Why a channel reads nothing good now: a port that never opened is said as such (not as a silent
 * device); otherwise the latest sample's own cause.
 */
function currentProblem(r: ChannelReading | undefined, h: ChannelHealth | undefined): string | null {
  if (h && !h.everOpened && h.status !== 'open') return describeDeviceProblem({ kind: 'port-never-opened', detail: h.lastError ?? 'still trying to open it' });
  if (h && h.status === 'error') return describeDeviceProblem({ kind: 'port-lost', detail: h.lastError ?? 'port closed' });
  return r?.status === 'ok' ? null : describeReading(r);
}

function describeReading(r: ChannelReading | undefined): string | null {
  return r?.problem ? describeDeviceProblem(r.problem) : null;
}
