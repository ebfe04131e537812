/**
 * What happened to a run that other parts of the server care about, published by the layer that
 * decided it (the run layer: a run closed; sign-off: submitted for review, signed) and heard by
 * whoever subscribed at start-up (mail notices, replay rollups, …). The publisher knows none of them:
 * the run layer imports no mail, PDF or report code. A subscriber's failure is logged and reaches
 * neither the publisher nor the other subscribers.
 */
import createDebug from 'debug';

const debug = createDebug('sscope:events');

export interface DomainEventMap {
  /** A run reached 'completed' or 'stopped' (its state is saved). */
  'run-closed': { runId: number; phase: 'completed' | 'stopped'; reason: string | null };
  /** A run's newest interpretation went to review. */
  'submitted-for-review': { runId: number; submitter: { id: number; name: string } };
  /** A run's revision was signed (and its report sealed). */
  signed: { runId: number; revision: number; signer: { id: number; name: string } };
}

export type DomainEventKind = keyof DomainEventMap;
type Handler<K extends DomainEventKind> = (event: DomainEventMap[K]) => unknown;

export class DomainEvents {
  private readonly handlers = new Map<DomainEventKind, Set<Handler<never>>>();
  private readonly running = new Set<Promise<unknown>>();

  /** Subscribes; returns the unsubscribe. */
  on<K extends DomainEventKind>(kind: K, handler: Handler<K>): () => void {
    const set = this.handlers.get(kind) ?? new Set();
    this.handlers.set(kind, set);
    set.add(handler as Handler<never>);
    return () => set.delete(handler as Handler<never>);
  }

  /** Hands the event to every subscriber; returns at once (subscribers' work goes on in the background). */
  publish<K extends DomainEventKind>(kind: K, event: DomainEventMap[K]): void {
    for (const handler of this.handlers.get(kind) ?? []) {
      const done = Promise.resolve()
        .then(() => (handler as Handler<K>)(event))
        .catch((err) => debug('%s subscriber failed for run %d: %s', kind, event.runId, (err as Error).message));
      this.running.add(done);
      void done.finally(() => this.running.delete(done));
    }
  }

  /** Resolves once every subscriber's work started so far has ended (tests; orderly stop). */
  async settled(): Promise<void> {
    while (this.running.size > 0) await Promise.allSettled([...this.running]);
  }
}
