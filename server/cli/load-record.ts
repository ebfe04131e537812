import { readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import { formatAgs4Problem } from '@shared/ags4/check';
import { importAgs4 } from '@shared/ags4/plate-import';
import { readingsCsvToRecord } from '@shared/records/csv';
import { RECORD_LIMITS, type TestRecord } from '@shared/records/schema';
import { formatIssue, parseTestRecord, type RecordImport } from '@shared/records/validate';

/** Input the command cannot use: a missing file, bad JSON or CSV, an invalid record. Exit code 2. */
export class BadInputError extends Error {
  override readonly name = 'BadInputError';
}

export type RecordFileFormat = 'json' | 'csv' | 'ags4';

/** JSON, CSV or AGS4, by the file's extension, else by its start (`{` = JSON, `"GROUP"` = AGS4). */
export function detectFormat(file: string, text: string): RecordFileFormat {
  const ext = path.extname(file).toLowerCase();
  if (ext === '.json') return 'json';
  if (ext === '.csv') return 'csv';
  if (ext === '.ags') return 'ags4';
  const start = text.trimStart(); // trimStart also drops a byte-order mark
  return start.startsWith('{') ? 'json' : start.startsWith('"GROUP"') ? 'ags4' : 'csv';
}

/** The one plate loading test of an AGS4 file (PLTG/PLTT, checked against the AGS4 rules first). */
function ags4Record(file: string, text: string): TestRecord {
  const outcome = importAgs4(text);
  if (!outcome.ok) {
    const more = outcome.omitted > 0 ? [`… and ${outcome.omitted} more problems`] : [];
    throw new BadInputError([`${file}: not a usable AGS4 file`, ...outcome.problems.map((p) => `  ${formatAgs4Problem(p)}`), ...more].join('\n'));
  }
  if (outcome.tests.length !== 1) {
    const tests = outcome.tests.map((t) => `${t.locationId} ${t.reference} at ${t.depthM} m`).join(', ');
    throw new BadInputError(`${file}: holds ${outcome.tests.length} plate loading tests (${tests}); the command reads a file of one test`);
  }
  return outcome.tests[0].record;
}

/** "line L, column C" of a character offset. */
function lineAndColumn(text: string, offset: number): string {
  const before = text.slice(0, offset).split('\n');
  return `line ${before.length}, column ${before[before.length - 1].length + 1}`;
}

function parseJson(file: string, text: string): unknown {
  try {
    return JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (error) {
    const message = (error as Error).message.replace(/\s+/g, ' ');
    const offset = /at position (\d+)/.exec(message);
    throw new BadInputError(`${file}: not valid JSON${offset ? ` (${lineAndColumn(text, Number(offset[1]))})` : ''}: ${message}`);
  }
}

function unwrap(file: string, outcome: RecordImport): TestRecord {
  if (outcome.ok) return outcome.record;
  const more = outcome.omitted > 0 ? [`… and ${outcome.omitted} more problems`] : [];
  throw new BadInputError([`${file}: not a valid test record`, ...outcome.errors.map((e) => `  ${formatIssue(e)}`), ...more].join('\n'));
}

/** Reads a record file (the JSON record, a readings CSV or an AGS4 file of one test) and validates it; bad input throws {@link BadInputError} naming the file and the field or line. */
export async function loadRecordFile(file: string): Promise<TestRecord> {
  const info = await stat(file).catch((error: NodeJS.ErrnoException) => {
    throw new BadInputError(`${file}: cannot read it (${error.code === 'ENOENT' ? 'no such file' : error.code})`);
  });
  if (!info.isFile()) throw new BadInputError(`${file}: not a file`);
  if (info.size > RECORD_LIMITS.bytes) throw new BadInputError(`${file}: ${info.size} bytes; a record file may have at most ${RECORD_LIMITS.bytes}`);
  const text = await readFile(file, 'utf8');
  const format = detectFormat(file, text);
  if (format === 'ags4') return ags4Record(file, text);
  return format === 'json' ? unwrap(file, parseTestRecord(parseJson(file, text))) : unwrap(file, readingsCsvToRecord(text));
}
