/**
 * `npm run ags4 -- --run N | --location N | --project N [--out FILE] [--issue N] [--status TEXT] [--contractor TEXT]`:
 * writes the tests of a run, a test location or a project as one AGS4 file (edition 4.1.1), checked
 * against the AGS4 rules before it is written, from the database `npm start` uses (SSCOPE_DB_* as for
 * the server). Exit codes: 0 written, 2 bad input (option, unknown id, nothing to export), 1 any other failure.
 */
import { writeFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { ags4ExportQuery } from '@shared/schemas/ags4';
import { defaultConfig } from '../config';
import { initModels } from '../db/models';
import { createSequelize } from '../db/sequelize';
import { HttpError } from '../http/errors';
import { Project } from '../models/project';
import { TestLocation } from '../models/test-location';
import { type Ags4Scope, ags4Export, locationScope, projectTestsScope, runScope } from '../services/ags4';
import { BadInputError } from './load-record';

const USAGE = `Usage: npm run ags4 -- (--run N | --location N | --project N) [options]

Writes the plate loading tests of a run, a test location or a project as one AGS4 file (edition 4.1.1),
checked against the AGS4 rules first.

Options:
  --out FILE          where to write (default: the file's own name in the current folder; - for stdout)
  --issue N           TRAN_ISNO, the issue sequence (default 1)
  --status TEXT       TRAN_STAT, e.g. Preliminary or Final (default Preliminary)
  --contractor TEXT   PROJ_CONT and PLTG_CONT, the testing organisation
  -h, --help          show this help

Exit codes: 0 written, 2 bad input (option, unknown id, nothing to export), 1 any other failure.`;

const OPTIONS = {
  run: { type: 'string' },
  location: { type: 'string' },
  project: { type: 'string' },
  out: { type: 'string' },
  issue: { type: 'string' },
  status: { type: 'string' },
  contractor: { type: 'string' },
  help: { type: 'boolean', short: 'h' },
} as const;

function options(args: readonly string[]) {
  let values: ReturnType<typeof parseArgs<{ options: typeof OPTIONS }>>['values'];
  try {
    values = parseArgs({ args: [...args], options: OPTIONS }).values;
  } catch (error) {
    throw new BadInputError(`${(error as Error).message}\n\n${USAGE}`);
  }
  if (values.help) return 'help' as const;
  const chosen = (['run', 'location', 'project'] as const).filter((k) => values[k] !== undefined);
  if (chosen.length !== 1) throw new BadInputError(`give exactly one of --run, --location, --project\n\n${USAGE}`);
  const id = Number(values[chosen[0]]);
  if (!Number.isInteger(id) || id <= 0) throw new BadInputError(`--${chosen[0]}: not an id: ${values[chosen[0]]}`);
  const query = ags4ExportQuery.safeParse({ issue: values.issue, status: values.status, contractor: values.contractor });
  if (!query.success) throw new BadInputError(query.error.issues.map((i) => `--${String(i.path[0])}: ${i.message}`).join('\n'));
  return { kind: chosen[0], id, out: values.out, query: query.data };
}

async function scopeOf(kind: 'run' | 'location' | 'project', id: number): Promise<Ags4Scope> {
  if (kind === 'run') return runScope(id);
  if (kind === 'location') {
    const location = await TestLocation.findByPk(id);
    if (!location) throw new BadInputError(`no test location ${id}`);
    return locationScope(location);
  }
  const project = await Project.findByPk(id);
  if (!project) throw new BadInputError(`no project ${id}`);
  return projectTestsScope(project);
}

async function main(args: readonly string[]): Promise<number> {
  const chosen = options(args);
  if (chosen === 'help') {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  const sequelize = createSequelize(defaultConfig().db, 2);
  initModels(sequelize);
  try {
    const file = await ags4Export(await scopeOf(chosen.kind, chosen.id), chosen.query);
    if (chosen.out === '-') process.stdout.write(file.text);
    else {
      const target = chosen.out ?? file.fileName;
      await writeFile(target, file.text);
      process.stderr.write(`ags4: wrote ${target}${file.notes.length ? `\n${file.notes.map((n) => `  note: ${n}`).join('\n')}` : ''}\n`);
    }
    return 0;
  } catch (error) {
    // 404 and 409 answers of the export (unknown run, nothing to export, a file that would break AGS4) are bad input here.
    if (error instanceof HttpError && error.status < 500) throw new BadInputError(error.message);
    throw error;
  } finally {
    await sequelize.close();
  }
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    const bad = error instanceof BadInputError;
    process.stderr.write(`ags4: ${bad ? error.message : ((error as Error)?.stack ?? String(error))}\n`);
    process.exitCode = bad ? 2 : 1;
  },
);
