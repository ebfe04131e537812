import type { Express } from 'express';
import type { Sequelize } from 'sequelize';
import request from 'supertest';
import { type AppParts, createApp } from '../../server/app';
import type { ServerConfig } from '../../server/config';
import { initModels } from '../../server/db/models';
import { createSequelize } from '../../server/db/sequelize';
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/seed/demo';
import type { Role } from '../../shared/schemas/users';
import { RunManager } from '../../server/runs/run-manager';
import { seededDatabase } from './test-database';

export interface TestApp extends AppParts {
  config: ServerConfig;
  sequelize: Sequelize;
  runs: RunManager;
  stop(): Promise<void>;
}

/** A migrated, demo-seeded database (a copy of the run's template) and the Express app over it (no listening socket; supertest drives it). */
export async function startTestApp(overrides: Partial<ServerConfig> = {}): Promise<TestApp> {
  const config = await seededDatabase(overrides);
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  const runs = new RunManager({ sequelize, dataDir: config.dataDir, pushView: () => {}, pushSamples: () => {} });
  const parts = createApp(sequelize, config, { runs });
  return {
    ...parts,
    config,
    sequelize,
    runs,
    stop: async () => {
      await runs.stopAll();
      parts.close();
      await sequelize.close();
    },
  };
}

export const demoEmail = (role: Role) => DEMO_USERS.find((u) => u.role === role)!.email;

/** A supertest agent with its own cookie jar that sends the CSRF token on every state-changing call. */
export class Client {
  readonly agent;
  token = '';
  constructor(app: Express | string) {
    this.agent = request.agent(app);
  }
  async csrf() {
    const res = await this.agent.get('/api/auth/csrf');
    this.token = res.body.csrfToken;
    return this;
  }
  get(url: string) {
    return this.agent.get(url);
  }
  post(url: string, body?: object) {
    return this.agent.post(url).set('x-csrf-token', this.token).send(body);
  }
  patch(url: string, body?: object) {
    return this.agent.patch(url).set('x-csrf-token', this.token).send(body);
  }
  delete(url: string) {
    return this.agent.delete(url).set('x-csrf-token', this.token);
  }
  /** A multipart POST of one file (field `file`) with text fields. */
  upload(url: string, file: { data: Buffer; name: string; type?: string }, fields: Record<string, string | number> = {}) {
    const req = this.agent.post(url).set('x-csrf-token', this.token);
    for (const [name, value] of Object.entries(fields)) req.field(name, String(value));
    return req.attach('file', file.data, { filename: file.name, ...(file.type ? { contentType: file.type } : {}) });
  }
  async signIn(email: string, password = DEMO_PASSWORD) {
    await this.csrf();
    const res = await this.post('/api/auth/login', { email, password });
    if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
    this.token = res.body.csrfToken;
    return this;
  }
}

export const signedIn = async (app: Express, role: Role) => new Client(app).signIn(demoEmail(role));
