/**
 * The dependency rules of the architecture (DEVELOPERS.md, Layout): shared/ is pure and imports no other layer;
 * devices/ knows nothing of runs or storage; no production code imports the simulator; the client
 * reaches the server only over HTTP; client features do not import each other.
 */
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
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
  const specs = [...text.matchAll(/(?:^|\n)\s*(?:import|export)\s[^'"]*?from\s+['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|(?:^|\n)\s*import\s+['"]([^'"]+)['"]/g)].map((m) => m[1] ?? m[2] ?? m[3]);
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

/** Every project file a file reaches through its imports (itself included), and the packages on the way. */
function reach(start: string[]): Set<string> {
  const seen = new Set<string>();
  const todo = [...start];
  while (todo.length > 0) {
    const file = todo.pop()!;
    if (seen.has(file)) continue;
    seen.add(file);
    if (!/\.(ts|tsx)$/.test(file)) continue; // a package
    for (const t of imports(file)) {
      const local = ['client', 'server', 'devices', 'shared', 'simulators'].includes(layer(t));
      const resolved = local ? [`${t}.ts`, `${t}.tsx`, path.join(t, 'index.ts'), t].find((c) => /\.(ts|tsx)$/.test(c) && existsSync(path.join(ROOT, c))) : t;
      if (resolved) todo.push(resolved);
    }
  }
  return seen;
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
  it('the run layer reaches no mail, PDF, report, sign-off or simulator code, even through other modules', () => {
    // It publishes what happened (services/domain-events); mail notices and rollups subscribe at start-up.
    const forbidden = (f: string) =>
      /^server\/services\/(mail|report-|signoff|run-record)/.test(f) || /^server\/ops\//.test(f) || layer(f) === 'simulators' || /^(nodemailer|pdfkit|pdf-lib|puppeteer|playwright-core)$/.test(f) || /pdf/i.test(f);
    const reached = [...reach(sources(path.join('server', 'runs')))];
    expect(reached.length).toBeGreaterThan(20); // the walk really follows imports
    expect(reached.filter(forbidden)).toEqual([]);
  });
  it('the run layer names no simulator control action', () => {
    // Production run code never steers a rig: the demo's automatic operator (server/ops) does, through the control port.
    const steering = sources(path.join('server', 'runs')).filter((f) => /controlUrl|\/pump\b|'top-up'\s*,\s*\{|tellSimulator/.test(readFileSync(path.join(ROOT, f), 'utf8')));
    expect(steering).toEqual([]);
  });
  it('the client imports no server-side code', () => {
    expect(violations('client', (t) => ['server', 'devices', 'simulators'].includes(layer(t)) || /^(sequelize|mariadb|express|serialport)$/.test(t))).toEqual([]);
  });
  it('client features do not import each other', () => {
    const feature = (p: string) => /client\/src\/features\/([^/]+)/.exec(p)?.[1];
    expect(violations('client', (t, file) => !!feature(t) && !!feature(file) && feature(t) !== feature(file))).toEqual([]);
  });
});
