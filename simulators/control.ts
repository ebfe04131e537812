import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { describeIssues, RIG_ACTIONS, type RigAction, type RigCommand, rigCommandSchema } from './commands';
import type { SimulatorState } from './rig-simulator';

/*
 * The simulator's control channel: how the operator's hands reach the simulated rig. Plain HTTP
 * with JSON bodies, bound to 127.0.0.1 only. Every reply is JSON; errors are
 * `{ "error": "…" }` with status 400 (bad body, naming the field), 404 (unknown route) or 500.
 *
 *   GET  /state                                    rig, gauges, ports and active faults
 *   POST /pump        { "pressureKpa": 200 }       pump to a mean plate pressure, kPa
 *                     { "gaugeMpa": 2.7 }          … or to an oil pressure on the jack gauge, MPa
 *   POST /top-up      {}                           pump back to the last target after leakage
 *   POST /release     {}                           open the release valve
 *   POST /gauge-reset { "gauge": 2 }               re-seat gauge 2 (1-based)
 *   POST /fault       { "kind": "drop", "durationS": 10, "device": "gauge-1" }
 *                     kinds: garbage, drop, split, merge, bad-crc, vanish; no device = all
 *   POST /speed       { "factor": 60 }             time acceleration ×1 … ×1000
 *   POST /maintain    { "tolerance": 0.02 }        automatic pressure maintainer (null = off)
 *
 * Successful POSTs answer with the state after the action, like GET /state.
 */

/** What the control channel drives; a {@link RigSimulator} provides it. */
export interface Controllable {
  apply(command: RigCommand): Promise<SimulatorState>;
  state(): SimulatorState;
}

/** Options of {@link startControlServer}. */
export interface ControlServerOptions {
  /** TCP port on 127.0.0.1; 0 picks a free one. Defaults to 8091. */
  port?: number;
}

export interface ControlServer {
  port: number;
  url: string;
  close(): Promise<void>;
}

export const DEFAULT_CONTROL_PORT = 8091;
const HOST = '127.0.0.1';
const MAX_BODY_BYTES = 16 * 1024;

class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

async function readJson(request: IncomingMessage): Promise<Record<string, unknown>> {
  let text = '';
  for await (const chunk of request) {
    text += chunk;
    if (text.length > MAX_BODY_BYTES) throw new HttpError(400, `body is larger than ${MAX_BODY_BYTES} bytes`);
  }
  if (text.trim() === '') return {};
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new HttpError(400, 'body is not valid JSON');
  }
  if (typeof body !== 'object' || body === null || Array.isArray(body)) throw new HttpError(400, 'body must be a JSON object');
  return body as Record<string, unknown>;
}

async function route(target: Controllable, request: IncomingMessage): Promise<SimulatorState> {
  const path = new URL(request.url ?? '/', `http://${HOST}`).pathname.replace(/^\//, '');
  if (request.method === 'GET' && path === 'state') return target.state();
  if (request.method !== 'POST' || !RIG_ACTIONS.includes(path as RigAction)) {
    throw new HttpError(404, `no route ${request.method} /${path}; see GET /state and POST /${RIG_ACTIONS.join(', /')}`);
  }
  // The route names the action; a body cannot override it.
  const parsed = rigCommandSchema.safeParse({ ...(await readJson(request)), action: path });
  if (!parsed.success) throw new HttpError(400, describeIssues(parsed.error));
  return target.apply(parsed.data);
}

function reply(response: ServerResponse, status: number, body: unknown): void {
  response.writeHead(status, { 'content-type': 'application/json' });
  response.end(JSON.stringify(body));
}

/** Serves the control channel for one simulated rig on 127.0.0.1. */
export async function startControlServer(target: Controllable, options: ControlServerOptions = {}): Promise<ControlServer> {
  const server = createServer((request, response) => {
    route(target, request).then(
      (state) => reply(response, 200, state),
      (error: Error) => {
        // The rig's own checks throw RangeError naming the field: the operator asked for something impossible.
        const status = error instanceof HttpError ? error.status : error instanceof RangeError ? 400 : 500;
        reply(response, status, { error: error.message });
      },
    );
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? DEFAULT_CONTROL_PORT, HOST, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  return {
    port,
    url: `http://${HOST}:${port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
