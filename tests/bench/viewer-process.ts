/**
 * A child process holding the P4 viewers (so their decoding does not count as server CPU): connects
 * `perRun` sockets to each run, reports 'ready' over IPC, and answers 'report' with what arrived.
 */
import { type TestSocket, connectSocket } from '../support/live-server';

interface Setup {
  baseUrl: string;
  cookie: string;
  runIds: number[];
  perRun: number;
}

async function main(setup: Setup): Promise<void> {
  let samples = 0;
  let views = 0;
  const sockets: TestSocket[] = [];
  for (const runId of setup.runIds) {
    for (let v = 0; v < setup.perRun; v++) {
      const s = await connectSocket(setup.baseUrl, setup.cookie);
      const ack = await s.emitWithAck('run:join', { runId, afterSeq: 0 });
      if (!ack.ok) throw new Error(`run:join refused: ${ack.error}`);
      s.on('run:samples', (batch) => {
        samples += batch.seq.length;
      });
      s.on('run:view', () => {
        views += 1;
      });
      sockets.push(s);
    }
  }
  process.send?.({ type: 'ready', sockets: sockets.length });
  process.on('message', (m: { type: string }) => {
    if (m.type === 'reset') {
      samples = 0;
      views = 0;
    }
    if (m.type === 'report') process.send?.({ type: 'report', samples, views });
    if (m.type === 'exit') {
      for (const s of sockets) s.close();
      process.exit(0);
    }
  });
}

main(JSON.parse(process.env.BENCH_VIEWERS ?? '{}') as Setup).catch((err) => {
  process.send?.({ type: 'error', message: (err as Error).message });
  process.exit(1);
});
