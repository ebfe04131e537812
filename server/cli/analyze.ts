/**
 * `npm run analyze -- FILE [--json]`: interprets a test record (Settlescope JSON record or readings CSV)
 * and prints the key results as a table, or the whole analysis as JSON. Exit codes: 0 done, 2 bad input
 * (option, file, record), 1 any other failure.
 */
import { parseArgs } from 'node:util';
import { analyzeRecord } from '@shared/interpretation/analyze-record';
import { renderAnalysis } from './analysis-text';
import { BadInputError, loadRecordFile } from './load-record';

const USAGE = `Usage: npm run analyze -- FILE [--json]

Interprets a plate load test record and prints the results: the Settlescope JSON record (.json) or a
readings CSV (.csv); other names are recognised by their first character.

Options:
  --json       print the whole analysis, with every formula and source, as JSON
  -h, --help   show this help

Exit codes: 0 done, 2 bad input (option, file or record), 1 any other failure.`;

function options(args: readonly string[]): { file: string; json: boolean } | 'help' {
  let parsed: ReturnType<typeof parseArgs<{ options: { json: { type: 'boolean' }; help: { type: 'boolean'; short: 'h' } }; allowPositionals: true }>>;
  try {
    parsed = parseArgs({ args: [...args], options: { json: { type: 'boolean' }, help: { type: 'boolean', short: 'h' } }, allowPositionals: true });
  } catch (error) {
    throw new BadInputError(`${(error as Error).message}\n\n${USAGE}`);
  }
  if (parsed.values.help) return 'help';
  if (parsed.positionals.length !== 1) {
    throw new BadInputError(`${parsed.positionals.length === 0 ? 'no FILE given' : `one FILE at a time (got ${parsed.positionals.length})`}\n\n${USAGE}`);
  }
  return { file: parsed.positionals[0], json: parsed.values.json ?? false };
}

async function main(args: readonly string[]): Promise<number> {
  const chosen = options(args);
  if (chosen === 'help') {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  const record = await loadRecordFile(chosen.file);
  const analysis = analyzeRecord(record);
  process.stdout.write(chosen.json ? `${JSON.stringify(analysis, null, 2)}\n` : renderAnalysis(analysis, chosen.file));
  return 0;
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    const bad = error instanceof BadInputError;
    process.stderr.write(`analyze: ${bad ? error.message : ((error as Error)?.stack ?? String(error))}\n`);
    process.exitCode = bad ? 2 : 1;
  },
);
