import { type ChildProcess, spawn } from 'node:child_process';
import { type ServerConfig, ROOT_DIR } from '../../server/config';

/** The API server as its own process (so a test can SIGKILL it), configured through the environment. */
export async function spawnServer(config: ServerConfig, port: number): Promise<{ child: ChildProcess; url: string; kill(signal?: NodeJS.Signals): Promise<void> }> {
  const env = {
    ...process.env,
    PORT: String(port),
    SSCOPE_DB_PORT: String(config.db.port),
    SSCOPE_DB_NAME: config.db.database,
    SSCOPE_DB_USER: config.db.user,
    SSCOPE_DB_PASSWORD: config.db.password,
    SSCOPE_DATA_DIR: config.dataDir,
    SSCOPE_SESSION_SECRET: config.sessionSecret,
  };
  if (process.env.SSCOPE_TEST_SERVER_LOG) Object.assign(env, { DEBUG: 'sscope:*' });
  // node itself (tsx as a loader), so a SIGKILL reaches the server and not only a wrapper.
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { cwd: ROOT_DIR, env, stdio: ['ignore', 'pipe', 'pipe'] });
  let log = '';
  child.stdout!.on('data', (d) => (log += d));
  child.stderr!.on('data', (d) => (log += d));
  if (process.env.SSCOPE_TEST_SERVER_LOG) child.on('exit', () => console.log(log));
  const url = `http://127.0.0.1:${port}`;
  const until = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited: ${log}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) break;
    } catch {}
    if (Date.now() > until) throw new Error(`server did not start: ${log}`);
    await new Promise((r) => setTimeout(r, 200));
  }
  const kill = (signal: NodeJS.Signals = 'SIGTERM') =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null || child.signalCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill(signal);
    });
  return { child, url, kill };
}
