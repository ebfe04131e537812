/**
 * P1: from a reading entering a run engine to its arrival at every socket viewer of the run, against
 * a bare socket.io echo (emitWithAck round trip) on loopback.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { Server } from 'socket.io';
import { io as connect } from 'socket.io-client';
import { connectSocket, type TestSocket } from '../support/live-server';
import { quantile, sleep } from './stats';

export interface Percentiles {
  count: number;
  p50: number;
  p95: number;
  p99: number;
}

const percentiles = (xs: number[]): Percentiles => ({ count: xs.length, p50: quantile(xs, 0.5), p95: quantile(xs, 0.95), p99: quantile(xs, 0.99) });

/** Joins `viewers` sockets to a run (signed in with `cookie`). */
export async function joinViewers(baseUrl: string, cookie: string, runId: number, viewers: number): Promise<TestSocket[]> {
  const sockets = await Promise.all(Array.from({ length: viewers }, () => connectSocket(baseUrl, cookie)));
  for (const s of sockets) {
    const ack = await s.emitWithAck('run:join', { runId, afterSeq: 0 });
    if (!ack.ok) throw new Error(`run:join refused: ${ack.error}`);
  }
  return sockets;
}

/**
 * Latency per sample per viewer: arrival (Date.now()) minus the sample's run-clock time, which is the
 * wall time it was read at for a run at speed 1.
 */
export async function liveLatency(sockets: TestSocket[], feed: () => () => number, durationMs: number): Promise<Percentiles> {
  const startMs = Date.now();
  const latencies: number[] = [];
  for (const s of sockets) {
    s.on('run:samples', (batch) => {
      const now = Date.now();
      for (const t of batch.t) if (t >= startMs) latencies.push(now - t);
    });
  }
  const stop = feed();
  await sleep(durationMs);
  stop();
  await sleep(300);
  for (const s of sockets) s.off('run:samples');
  return percentiles(latencies);
}

/** Round trips of a small JSON message through a bare socket.io server on loopback. */
export async function echoBaseline(messages: number): Promise<Percentiles> {
  const server = http.createServer();
  const io = new Server(server);
  io.on('connection', (s) => s.on('echo', (payload: unknown, ack: (p: unknown) => void) => ack(payload)));
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const client = connect(`http://127.0.0.1:${(server.address() as AddressInfo).port}`, { transports: ['websocket'], forceNew: true, reconnection: false });
  await new Promise<void>((r) => client.once('connect', () => r()));
  const rtt: number[] = [];
  for (let i = 0; i < messages; i++) {
    const start = performance.now();
    await client.emitWithAck('echo', { seq: i, t: [i], value: [i * 3] });
    rtt.push(performance.now() - start);
  }
  client.close();
  await io.close();
  return percentiles(rtt.slice(Math.min(100, messages >> 2)));
}
