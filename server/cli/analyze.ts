/**
 * `npm run analyze -- FILE [--json] [design inputs]`: interprets a test record (Settlescope JSON record or readings CSV)
 * and prints the key results as a table, or the whole analysis as JSON. Exit codes: 0 done, 2 bad input
 * (option, file, record), 1 any other failure.
 */
import { parseArgs } from 'node:util';
import { analyzeRecord } from '@shared/interpretation/analyze-record';
import { applyDesignInputs } from '@shared/interpretation/design-inputs';
import { InterpretationInputError } from '@shared/interpretation/input-checks';
import type { InterpretationSettings } from '@shared/schemas/interpretation';
import { renderAnalysis } from './analysis-text';
import { DESIGN_OPTIONS, DESIGN_USAGE, designSettings, flagOf } from './analyze-options';
import { BadInputError, loadRecordFile } from './load-record';

const USAGE = `Usage: npm run analyze -- FILE [--json] [design inputs]

Interprets a plate load test record and prints the results: the Settlescope JSON record (.json), a
readings CSV (.csv) or an AGS4 file of one test (.ags); other names are recognised by how they start.

Options:
  --json       print the whole analysis, with every formula and source, as JSON
  -h, --help   show this help

${DESIGN_USAGE}

Exit codes: 0 done, 2 bad input (option, file or record), 1 any other failure.`;

const OPTIONS = { json: { type: 'boolean' }, help: { type: 'boolean', short: 'h' }, ...DESIGN_OPTIONS } as const;

function options(args: readonly string[]): { file: string; json: boolean; settings: InterpretationSettings } | 'help' {
  let parsed: ReturnType<typeof parseArgs<{ options: typeof OPTIONS; allowPositionals: true }>>;
  try {
    parsed = parseArgs({ args: [...args], options: OPTIONS, allowPositionals: true });
  } catch (error) {
    throw new BadInputError(`${(error as Error).message}\n\n${USAGE}`);
  }
  if (parsed.values.help) return 'help';
  if (parsed.positionals.length !== 1) {
    throw new BadInputError(`${parsed.positionals.length === 0 ? 'no FILE given' : `one FILE at a time (got ${parsed.positionals.length})`}\n\n${USAGE}`);
  }
  return { file: parsed.positionals[0], json: parsed.values.json ?? false, settings: designSettings(parsed.values) };
}

async function main(args: readonly string[]): Promise<number> {
  const chosen = options(args);
  if (chosen === 'help') {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  let input: ReturnType<typeof applyDesignInputs>;
  try {
    input = applyDesignInputs(await loadRecordFile(chosen.file), chosen.settings);
  } catch (error) {
    if (error instanceof InterpretationInputError) throw new BadInputError(`${flagOf(error.field)}: ${error.message.slice(error.field.length + 2)}`);
    throw error;
  }
  const analysis = analyzeRecord(input.record, input.options);
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
