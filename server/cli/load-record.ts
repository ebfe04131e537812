import { readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import { readingsCsvToRecord } from '@shared/records/csv';
import { RECORD_LIMITS, type TestRecord } from '@shared/records/schema';
import { formatIssue, parseTestRecord, type RecordImport } from '@shared/records/validate';

/** Input the command cannot use: a missing file, bad JSON or CSV, an invalid record. Exit code 2. */
export class BadInputError extends Error {
  override readonly name = 'BadInputError';
}

export type RecordFileFormat = 'json' | 'csv';

/** JSON or CSV, by the file's extension, else by its first character (`{` = JSON). */
export function detectFormat(file: string, text: string): RecordFileFormat {
  const ext = path.extname(file).toLowerCase();
  if (ext === '.json') return 'json';
  if (ext === '.csv') return 'csv';
  return text.trimStart().startsWith('{') ? 'json' : 'csv'; // trimStart also drops a byte-order mark
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

/** Reads a record file (the JSON record or a readings CSV) and validates it; bad input throws {@link BadInputError} naming the file and the field or line. */
export async function loadRecordFile(file: string): Promise<TestRecord> {
  const info = await stat(file).catch((error: NodeJS.ErrnoException) => {
    throw new BadInputError(`${file}: cannot read it (${error.code === 'ENOENT' ? 'no such file' : error.code})`);
  });
  if (!info.isFile()) throw new BadInputError(`${file}: not a file`);
  if (info.size > RECORD_LIMITS.bytes) throw new BadInputError(`${file}: ${info.size} bytes; a record file may have at most ${RECORD_LIMITS.bytes}`);
  const text = await readFile(file, 'utf8');
  return detectFormat(file, text) === 'json' ? unwrap(file, parseTestRecord(parseJson(file, text))) : unwrap(file, readingsCsvToRecord(text));
}
