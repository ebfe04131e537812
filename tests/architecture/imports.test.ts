/**
 * The dependency rules of the architecture (DEVELOPERS.md, Layout): shared/ is pure and imports no other layer;
 * devices/ knows nothing of runs or storage; no production code imports the simulator; the client
 * reaches the server only over HTTP; client features do not import each other.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(import.meta.dirname, '../..');

function sources(dir: string): string[] {
  const abs = path.join(ROOT, dir);
  let out: string[] = [];
  for (const name of readdirSync(abs)) {
    const rel = path.join(dir, name);
    if (statSync(path.join(ROOT, rel)).isDirectory()) out = out.concat(sources(rel));
    else if (/\.(ts|tsx)$/.test(name)) out.push(rel);
  }
  return out;
}

/** Import specifiers of a file, resolved to a project folder when relative or aliased. */
function imports(file: string): string[] {
  const text = readFileSync(path.join(ROOT, file), 'utf8');
  const specs = [...text.matchAll(/(?:^|\n)\s*(?:import|export)\s[^'"]*?from\s+['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g)].map((m) => m[1] ?? m[2]);
  return specs.map((s) => {
    if (s.startsWith('@shared/')) return `shared/${s.slice(8)}`;
    if (s.startsWith('.')) return path.relative(ROOT, path.resolve(path.dirname(path.join(ROOT, file)), s));
    return s;
  });
}

const layer = (p: string) => p.split(path.sep)[0];

function violations(dir: string, forbidden: (target: string, file: string) => boolean): string[] {
  return sources(dir).flatMap((file) => imports(file).filter((t) => forbidden(t, file)).map((t) => `${file} → ${t}`));
}

const IO_MODULES = /^(node:)?(fs|fs\/promises|net|http|https|child_process|dgram|tls)$|^(serialport|sequelize|mariadb|express|socket\.io|ws|modbus-serial)$/;

describe('architecture', () => {
  it('shared/ imports no other layer and does no I/O', () => {
    expect(violations('shared', (t) => ['client', 'server', 'devices', 'simulators', 'tests'].includes(layer(t)) || IO_MODULES.test(t))).toEqual([]);
  });
  it('devices/ knows nothing of runs, storage, the client or the simulator', () => {
    expect(violations('devices', (t) => ['client', 'server', 'simulators'].includes(layer(t)) || /^(sequelize|mariadb|express)$/.test(t))).toEqual([]);
  });
  it('no production code imports the simulator', () => {
    for (const dir of ['client', 'server', 'devices', 'shared']) expect(violations(dir, (t) => layer(t) === 'simulators')).toEqual([]);
  });
  it('the client imports no server-side code', () => {
    expect(violations('client', (t) => ['server', 'devices', 'simulators'].includes(layer(t)) || /^(sequelize|mariadb|express|serialport)$/.test(t))).toEqual([]);
  });
  it('client features do not import each other', () => {
    const feature = (p: string) => /client\/src\/features\/([^/]+)/.exec(p)?.[1];
    expect(violations('client', (t, file) => !!feature(t) && !!feature(file) && feature(t) !== feature(file))).toEqual([]);
  });
});
