import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Sequelize } from 'sequelize';
import { RigMonitor } from './acquisition/rig-monitor';
import { type AppParts, createApp } from './app';
import type { ServerConfig } from './config';
import { migrate } from './db/migrator';
import { initModels } from './db/models';
import { mailTarget } from './ops/mail-fake';
import { DomainEvents } from './services/domain-events';
import { configureMailer, subscribeMailNotices } from './services/mail';
import { createSequelize } from './db/sequelize';
import { runRoom, socketEvents } from './realtime/events';
import { RunManager } from './runs/run-manager';
import { buildRollups, toBatch } from './runs/samples-query';
import { type SocketEventSpec, createSocketServer } from './realtime/socket-server';

export interface RunningServer {
  url: string;
  port: number;
  sequelize: Sequelize;
  runs: RunManager;
  routes: AppParts['routes'];
  socketEvents: SocketEventSpec[];
  close(): Promise<void>;
}

/** Connects to the database, migrates it, and serves the app and its sockets on config.host:config.port (0 = any free port). */
export async function startServer(config: ServerConfig): Promise<RunningServer> {
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  await migrate(sequelize);
  // Mail goes to the configured SMTP server; without one, to the local catcher (the app's mailbox).
  const { smtp, catcher } = await mailTarget(config.mail);
  const releaseMailer = configureMailer({ ...smtp, from: config.mail.from });
  let sockets: ReturnType<typeof createSocketServer> | null = null;
  // What happens to runs (closed, submitted for review, signed), and who hears it.
  const domainEvents = new DomainEvents();
  const unsubscribe = [subscribeMailNotices(domainEvents)];
  const runs = new RunManager({
    sequelize,
    dataDir: config.dataDir,
    events: domainEvents,
    pushView: (runId, view) => sockets?.io.to(runRoom(runId)).emit('run:view', view),
    pushSamples: (runId, rows) => sockets?.io.to(runRoom(runId)).emit('run:samples', toBatch(runId, rows)),
  });
  // A closed run's per-minute rollups, once its samples are archived, make its replay fast.
  unsubscribe.push(domainEvents.on('run-closed', ({ runId }) => runs.archiver.drain().then(() => buildRollups(sequelize, runId))));
  const parts = createApp(sequelize, config, { runs, events: domainEvents, onSignOut: (sid) => sockets?.disconnectSession(sid) });
  const server = http.createServer(parts.app);
  sockets = createSocketServer(server, parts.sessionMiddleware);
  const monitor = new RigMonitor(sockets.io, (rigId) => runs.rigBusy(rigId));
  const events = socketEvents(monitor, runs, sockets.io);
  sockets.handle(events);
  await runs.resumeAll();
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${config.host}:${port}`,
    port,
    sequelize,
    runs,
    routes: parts.routes,
    socketEvents: events,
    close: async () => {
      await monitor.closeAll();
      await runs.stopAll();
      for (const off of unsubscribe) off();
      await sockets?.close();
      releaseMailer();
      await catcher?.close();
      parts.close();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await sequelize.close();
    },
  };
}
