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

export function createShutdown(log: (message: string) => void = console.log): Shutdown {
  const steps: { name: string; step: () => Promise<void> | void }[] = [];
  let stopping: Promise<void> | null = null;

  const stop = (code = 0) => {
    stopping ??= (async () => {
      for (const { name, step } of [...steps].reverse()) {
        try {
          await step();
        } catch (err) {
          console.error(`Stopping ${name} failed: ${(err as Error).message}`);
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
