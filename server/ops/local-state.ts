import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** Secrets generated on first start and kept (mode 0600) in the data folder, so restarts reuse them. */
export interface LocalSecrets {
  dbPassword: string;
  sessionSecret: string;
}

export function loadOrCreateSecrets(dataDir: string): LocalSecrets {
  const file = path.join(dataDir, 'secrets.json');
  if (existsSync(file)) return JSON.parse(readFileSync(file, 'utf8')) as LocalSecrets;
  mkdirSync(dataDir, { recursive: true });
  const secrets = { dbPassword: randomBytes(18).toString('base64url'), sessionSecret: randomBytes(32).toString('hex') };
  writeFileSync(file, JSON.stringify(secrets, null, 2), { mode: 0o600 });
  return secrets;
}
