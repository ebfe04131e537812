/**
 * The demo's automatic operator: a stand-in for the person at a simulated rig. It follows every run
 * on its rig through the same HTTP API a person's console uses (signed in as a person), and does with
 * the rig what that person's hands would do, through the simulator's control port: pumps to each
 * prompted target (opens the release valve for a target of 0), tops up when someone asks the run for
 * a top-up, and releases the load once the run closes. Production run code never steers a rig; this
 * runs only beside a simulated one (npm start, tests).
 */
import { request } from 'node:http';
import createDebug from 'debug';
import { ACTIVE_PHASES, type RunView } from '../../shared/schemas/runs';

const debug = createDebug('sscope:auto-operator');

export interface AutoOperatorOptions {
  /** The server's API, e.g. http://127.0.0.1:8080. */
  serverUrl: string;
  /** The simulated rig's control port, e.g. http://127.0.0.1:8091. */
  controlUrl: string;
  /** The rig it stands at: runs on other rigs are none of its business. */
  rigId: number;
  /** The account it signs in with (a staff member who may read runs). */
  email: string;
  password: string;
  /** How often it looks at the runs it follows, ms. Default 100. */
  pollMs?: number;
  /** How often it looks for new runs, ms. Default 1000. */
  listMs?: number;
}

export interface AutoOperator {
  stop(): Promise<void>;
}

/** What the operator remembers of a run it follows. */
interface Followed {
  /** The stage and target it last pumped to ("index:kPa"). */
  pumped: string | null;
  version: number;
  /** Events already read (top-ups among them already done). */
  eventsSeen: number;
}

type Action = 'pump' | 'top-up' | 'release';

/** Starts following; stop() ends it after the current look. */
export function startAutoOperator(o: AutoOperatorOptions): AutoOperator {
  const api = new ApiSession(o.serverUrl, o.email, o.password);
  const pollMs = o.pollMs ?? 100;
  const listMs = o.listMs ?? 1000;
  const followed = new Map<number, Followed>();
  const elsewhere = new Set<number>();
  let lastList = Number.NEGATIVE_INFINITY;
  let stopped = false;

  const rig = (action: Action, body: object = {}) => tellSimulator(o.controlUrl, action, body);

  async function look(): Promise<void> {
    if (performance.now() - lastList >= listMs) {
      lastList = performance.now();
      const list = (await api.get('/api/runs')) as { items: { id: number; phase: RunView['phase'] }[] } | null;
      for (const r of list?.items ?? []) {
        if (ACTIVE_PHASES.includes(r.phase) && !followed.has(r.id) && !elsewhere.has(r.id)) followed.set(r.id, { pumped: null, version: -1, eventsSeen: -1 });
      }
    }
    for (const [runId, f] of followed) {
      const view = (await api.get(`/api/runs/${runId}`)) as RunView | null;
      if (!view) continue;
      if (view.rigId !== o.rigId) {
        followed.delete(runId);
        elsewhere.add(runId);
        continue;
      }
      await follow(view, f);
      if (!ACTIVE_PHASES.includes(view.phase)) followed.delete(runId);
    }
  }

  async function follow(view: RunView, f: Followed): Promise<void> {
    if (view.version !== f.version) {
      // Commands show in the run's events: a top-up asked for on any console is pumped here.
      const events = (await api.get(`/api/runs/${view.id}/events`)) as { items: { kind: string }[] } | null;
      if (!events) return;
      const fresh = f.eventsSeen < 0 ? [] : events.items.slice(f.eventsSeen);
      f.eventsSeen = events.items.length;
      f.version = view.version;
      if (fresh.some((e) => e.kind === 'top-up')) await rig('top-up');
    }
    if (!ACTIVE_PHASES.includes(view.phase)) {
      await rig('release');
      return;
    }
    const prompt = view.prompt;
    if (view.phase !== 'pumping' || !prompt) return;
    const key = `${view.stageIndex}:${prompt.targetKpa}`;
    if (f.pumped === key) return;
    // A prompt the jack must not follow (beyond its calibration or rating) is not pumped to.
    if (prompt.targetKpa > 0 && prompt.gaugePressure === null) return;
    f.pumped = key;
    if (prompt.targetKpa === 0) await rig('release');
    else await rig('pump', { pressureKpa: prompt.targetKpa });
  }

  const loop = (async () => {
    while (!stopped) {
      try {
        await look();
      } catch (err) {
        debug('look failed (%s); trying again', (err as Error).message); // the server restarting, say
      }
      await new Promise((r) => setTimeout(r, pollMs));
    }
  })();

  return {
    stop: async () => {
      stopped = true;
      await loop;
    },
  };
}

/** One HTTP exchange on a connection of its own (no keep-alive: the operator never holds a server's closing open). */
function exchange(url: string, method: 'GET' | 'POST', headers: Record<string, string>, body?: string): Promise<{ status: number; cookies: string[]; text: string }> {
  return new Promise((resolve, reject) => {
    const req = request(url, { method, headers: { ...headers, connection: 'close' }, agent: false, timeout: 10_000 }, (res) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (chunk) => {
        text += chunk;
      });
      res.on('end', () => resolve({ status: res.statusCode ?? 0, cookies: (res.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]), text }));
      res.on('error', reject);
    });
    req.on('timeout', () => req.destroy(new Error('no answer in 10 s')));
    req.on('error', reject);
    req.end(body);
  });
}

/** Signed-in GETs against the API, signing in again when the session has gone. */
class ApiSession {
  private cookie: string | null = null;

  constructor(
    private readonly baseUrl: string,
    private readonly email: string,
    private readonly password: string,
  ) {}

  /** The JSON answer, or null for anything but 200. */
  async get(path: string): Promise<unknown> {
    if (!this.cookie) await this.signIn();
    let res = await exchange(`${this.baseUrl}${path}`, 'GET', { cookie: this.cookie ?? '' });
    if (res.status === 401) {
      await this.signIn();
      res = await exchange(`${this.baseUrl}${path}`, 'GET', { cookie: this.cookie ?? '' });
    }
    return res.status === 200 ? JSON.parse(res.text) : null;
  }

  private async signIn(): Promise<void> {
    const pre = await exchange(`${this.baseUrl}/api/auth/csrf`, 'GET', {});
    const { csrfToken } = JSON.parse(pre.text) as { csrfToken: string };
    const body = JSON.stringify({ email: this.email, password: this.password });
    const res = await exchange(`${this.baseUrl}/api/auth/login`, 'POST', { 'content-type': 'application/json', 'x-csrf-token': csrfToken, cookie: pre.cookies[0] ?? '' }, body);
    if (res.status !== 200) throw new Error(`sign-in as ${this.email} refused (${res.status})`);
    this.cookie = res.cookies[0] ?? null;
  }
}

/**
 * Sends an action to the simulated rig, retrying a few times: a pooled keep-alive connection the
 * simulator has just closed fails once, and a lost "pump" would leave the rig idle.
 */
async function tellSimulator(controlUrl: string, action: Action, body: object): Promise<void> {
  for (let attempt = 1; attempt <= 4; attempt++) {
    try {
      const res = await fetch(`${controlUrl}/${action}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
      if (!res.ok) debug('rig refused %s: %s', action, await res.text());
      else await res.body?.cancel();
      return;
    } catch (err) {
      debug('rig %s, attempt %d: %s', action, attempt, (err as Error).message);
      await new Promise((r) => setTimeout(r, 100 * attempt));
    }
  }
}
