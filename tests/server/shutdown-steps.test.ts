/** The start script's shutdown: every step once, last started first, and a step that hangs does not stop the rest. */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createShutdown } from '../../server/ops/shutdown';

afterEach(() => vi.restoreAllMocks());

describe('shutdown steps', () => {
  it('runs each step once in reverse order, goes past a hung step, then exits', async () => {
    const exit = vi.spyOn(process, 'exit').mockImplementation((() => undefined) as never);
    vi.spyOn(console, 'error').mockImplementation(() => {});
    const ran: string[] = [];
    const shutdown = createShutdown(() => {}, 50);
    shutdown.add('database', () => void ran.push('database'));
    shutdown.add('server', () => new Promise<void>(() => ran.push('server'))); // never settles
    shutdown.add('rig', () => void ran.push('rig'));
    await Promise.all([shutdown.stop(0), shutdown.stop(0)]);
    expect(ran).toEqual(['rig', 'server', 'database']);
    expect(exit).toHaveBeenCalledTimes(1);
    expect(exit).toHaveBeenCalledWith(0);
  });
});
