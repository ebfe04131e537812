/**
 * The API server on its own, configured from the environment (used by `npm run dev` under
 * `tsx watch`; `npm start` runs the same server in-process).
 */
import { defaultConfig } from './config';
import { startServer } from './main';

const server = await startServer(defaultConfig({ clientDir: null }));
console.log(`API listening on ${server.url}`);
const stop = async () => {
  await server.close();
  process.exit(0);
};
process.once('SIGINT', stop);
process.once('SIGTERM', stop);
