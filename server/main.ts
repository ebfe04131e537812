import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Sequelize } from 'sequelize';
import { RigMonitor } from './acquisition/rig-monitor';
import { type AppParts, createApp } from './app';
import type { ServerConfig } from './config';
import { migrate } from './db/migrator';
import { initModels } from './db/models';
import { createSequelize } from './db/sequelize';
import { socketEvents } from './realtime/events';
import { type SocketEventSpec, createSocketServer } from './realtime/socket-server';

export interface RunningServer {
  url: string;
  port: number;
  sequelize: Sequelize;
  routes: AppParts['routes'];
  socketEvents: SocketEventSpec[];
  close(): Promise<void>;
}

/** Connects to the database, migrates it, and serves the app and its sockets on config.host:config.port (0 = any free port). */
export async function startServer(config: ServerConfig): Promise<RunningServer> {
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  await migrate(sequelize);
  let disconnectSession: (sid: string) => void = () => {};
  const parts = createApp(sequelize, config, { onSignOut: (sid) => disconnectSession(sid) });
  const server = http.createServer(parts.app);
  const sockets = createSocketServer(server, parts.sessionMiddleware);
  const monitor = new RigMonitor(sockets.io);
  const events = socketEvents(monitor);
  sockets.handle(events);
  disconnectSession = sockets.disconnectSession;
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${config.host}:${port}`,
    port,
    sequelize,
    routes: parts.routes,
    socketEvents: events,
    close: async () => {
      await monitor.closeAll();
      await sockets.close();
      parts.close();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await sequelize.close();
    },
  };
}
