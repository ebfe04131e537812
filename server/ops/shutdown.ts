/**
 * One orderly shutdown for the start script: the steps registered while starting run once, last
 * started first, each awaited. Ctrl-C in a terminal signals the whole process group, and a user
 * may press it twice: later signals only say that stopping is under way, so the database always
 * gets its clean shutdown.
 */
export interface Shutdown {
  /** Registers a step; steps run in reverse order of registration. */
  add(name: string, step: () => Promise<void> | void): void;
  /** Runs every step once (later calls get the same promise), then exits with `code`. */
  stop(code?: number): Promise<void>;
}

/** Longest wait for one stop step; MariaDB's own stop escalates to SIGKILL well within it. */
const STEP_DEADLINE_MS = 45_000;

export function createShutdown(log: (message: string) => void = console.log, stepDeadlineMs = STEP_DEADLINE_MS): Shutdown {
  const steps: { name: string; step: () => Promise<void> | void }[] = [];
  let stopping: Promise<void> | null = null;

  const stop = (code = 0) => {
    stopping ??= (async () => {
      for (const { name, step } of [...steps].reverse()) {
        let timer: NodeJS.Timeout | undefined;
        // A step that never ends (a server waiting on a vanished database) must not keep the rest,
        // MariaDB's own clean shutdown above all, from running.
        const gaveUp = new Promise<'gave-up'>((resolve) => {
          timer = setTimeout(() => resolve('gave-up'), stepDeadlineMs);
        });
        try {
          if ((await Promise.race([Promise.resolve().then(step), gaveUp])) === 'gave-up') console.error(`Stopping ${name} took over ${stepDeadlineMs / 1000} s; going on without it.`);
        } catch (err) {
          console.error(`Stopping ${name} failed: ${(err as Error).message}`);
        } finally {
          clearTimeout(timer);
        }
      }
      process.exit(code);
    })();
    return stopping;
  };

  const onSignal = (signal: NodeJS.Signals) => {
    if (stopping) {
      log(`(${signal}) Still stopping — waiting for the database to shut down cleanly…`);
      return;
    }
    log(`\n${signal}: stopping…`);
    void stop(0);
  };
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) process.on(signal, onSignal);

  return { add: (name, step) => steps.push({ name, step }), stop };
}
