import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { ROOT_DIR } from '../config';

/** What the client build is made from: a change to any of these makes `npm start` build again. */
const SOURCES = ['client', 'shared', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];

function newestMtime(target: string): number {
  const stat = statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs; // a deleted file shows as a newer folder
  for (const entry of readdirSync(target)) newest = Math.max(newest, newestMtime(path.join(target, entry)));
  return newest;
}

/** True when dist/client was built after the last change to anything it is built from. */
export function clientBuildIsCurrent(root = ROOT_DIR): boolean {
  const index = path.join(root, 'dist', 'client', 'index.html');
  if (!existsSync(index)) return false;
  const built = statSync(index).mtimeMs;
  return SOURCES.map((s) => path.join(root, s)).every((s) => !existsSync(s) || newestMtime(s) < built);
}
