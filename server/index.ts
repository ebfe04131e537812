/**
 * The API server on its own, configured from the environment (used by `npm run dev` under
 * `tsx watch`; `npm start` runs the same server in-process).
 */
import { defaultConfig } from './config';
import { startServer } from './main';

const server = await startServer(defaultConfig({ clientDir: null }));
console.log(`API listening on ${server.url}`);
let stopping = false;
const stop = () => {
  if (stopping) return; // a second Ctrl-C while closing changes nothing
  stopping = true;
  void server.close().then(() => process.exit(0));
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
