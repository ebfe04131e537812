import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from './app';
import type { ServerConfig } from './config';
import { initModels } from './db/models';
import { migrate } from './db/migrator';
import { createSequelize } from './db/sequelize';

export interface RunningServer {
  url: string;
  port: number;
  close(): Promise<void>;
}

/** Connects to the database, migrates it, and serves the app on config.host:config.port (0 = any free port). */
export async function startServer(config: ServerConfig): Promise<RunningServer> {
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  await migrate(sequelize);
  const parts = createApp(sequelize, config);
  const server = http.createServer(parts.app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${config.host}:${port}`,
    port,
    close: async () => {
      parts.close();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await sequelize.close();
    },
  };
}
