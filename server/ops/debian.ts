import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';

export interface Requirement {
  /** A program the package provides, looked up on PATH and in the sbin folders. */
  binary: string;
  pkg: string;
}

const DIRS = () => [...(process.env.PATH ?? '').split(':'), '/usr/sbin', '/usr/bin', '/sbin', '/bin'];

/** Full path of a program on PATH or in the sbin folders, or null. */
export function findBinary(name: string): string | null {
  for (const dir of DIRS()) if (dir && existsSync(path.join(dir, name))) return path.join(dir, name);
  return null;
}
export const hasBinary = (name: string) => findBinary(name) !== null;

/**
 * Installs the Debian packages whose programs are missing (as root, with apt-get); otherwise
 * stops with a message saying exactly what to install.
 */
export async function ensureDebianPackages(reqs: Requirement[], log: (m: string) => void = console.log): Promise<void> {
  const missing = [...new Set(reqs.filter((r) => !hasBinary(r.binary)).map((r) => r.pkg))];
  if (missing.length === 0) return;
  if (process.getuid?.() !== 0 || !hasBinary('apt-get')) {
    throw new Error(`Missing programs; install these Debian packages first: sudo apt-get install -y ${missing.join(' ')}`);
  }
  log(`Installing Debian packages: ${missing.join(' ')}…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update', '-q'], { stdio: 'inherit', env });
  execFileSync('apt-get', ['install', '-y', '-q', '--no-install-recommends', ...missing], { stdio: 'inherit', env });
}
