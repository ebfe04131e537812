import { type CsvError, parse } from 'csv-parse/sync';
import type { ReductionRule, StagePoint } from '../interpretation/reduction';
import { GAUGE_KEY_PATTERN, RECORD_BRANCHES, RECORD_FORMAT, RECORD_LIMITS, RECORD_VERSION, type TestRecord } from './schema';
import { IssueList, issueField, type RecordImport, type RecordIssue, validateRecord } from './validate';

/**
 * Settlescope readings CSV: one row per reading.
 *
 * - Lines whose first character is `#` are comments and are ignored, except the settings at the top:
 *   before the header, `# name: value` with a name from {@link CSV_SETTINGS} (e.g. `# plate_size_mm: 450`)
 *   sets that part of the record. Above the header such a line may also be one quoted cell
 *   (`"# weather: Dry, 14 °C"`, a `"` doubled inside), as exports write them. `plate_shape` and `plate_size_mm` are required unless the caller gives
 *   the plate. Blank lines are ignored.
 * - The header is the first other line: `stage,branch,target_kpa,t_min,pressure_kpa` in this order
 *   (case and surrounding spaces ignored), then one column per gauge named by its key (a letter, then up
 *   to 31 letters, digits, `_` or `-`), 1 to 12 gauges, each once.
 * - Every row has as many fields as the header. `stage` is a whole number; `branch` is seating, loading,
 *   unloading or reloading; the rest are plain decimal numbers with a `.` (sign and exponent allowed, no
 *   thousands separators): target and measured plate pressure in kPa, minutes since the stage's target was
 *   reached, and each gauge's zero-corrected settlement in mm. No cell may be empty.
 * - A stage's rows are consecutive and repeat its branch and target; stage numbers rise; times within a
 *   stage do not go back.
 *
 * Gauge labels and positions, events, the hold rule and the footing's design values are not in the CSV;
 * give them in `base` when importing.
 */
export const READINGS_COLUMNS = ['stage', 'branch', 'target_kpa', 't_min', 'pressure_kpa'] as const;

/** Record fields a CSV import takes from the caller; the CSV's own settings override them. */
export type RecordBase = Partial<Omit<TestRecord, 'format' | 'version' | 'stages'>>;

type SettingKind = 'text' | 'number' | 'readAtMin';

/** The `# name: value` settings of the CSV preamble and the record field each one sets. */
export const CSV_SETTINGS: readonly { name: string; path: readonly string[]; kind: SettingKind }[] = [
  { name: 'project', path: ['metadata', 'project'], kind: 'text' },
  { name: 'client', path: ['metadata', 'client'], kind: 'text' },
  { name: 'site', path: ['metadata', 'site'], kind: 'text' },
  { name: 'pit', path: ['metadata', 'pit'], kind: 'text' },
  { name: 'test_date', path: ['metadata', 'testDate'], kind: 'text' },
  { name: 'crew', path: ['metadata', 'crew'], kind: 'text' },
  { name: 'weather', path: ['metadata', 'weather'], kind: 'text' },
  { name: 'procedure', path: ['plan', 'procedureId'], kind: 'text' },
  { name: 'seating_kpa', path: ['plan', 'seatingPressureKpa'], kind: 'number' },
  /** The stage point is read this many minutes into each stage (otherwise at the end of the hold). */
  { name: 'read_at_min', path: ['plan', 'reduction'], kind: 'readAtMin' },
  { name: 'plate_shape', path: ['plate', 'shape'], kind: 'text' },
  { name: 'plate_size_mm', path: ['plate', 'sizeMm'], kind: 'number' },
  { name: 'footing_shape', path: ['footing', 'shape'], kind: 'text' },
  { name: 'footing_width_m', path: ['footing', 'widthM'], kind: 'number' },
  { name: 'footing_soil', path: ['footing', 'soilBehaviour'], kind: 'text' },
];

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const SETTING_LINE = /^#\s*([a-z_]+)\s*:\s*(.*?)\s*$/;
const READING_FIELDS: Record<string, string> = { tMin: 't_min', pressureKpa: 'pressure_kpa', index: 'stage', branch: 'branch', targetKpa: 'target_kpa' };

type Json = Record<string, unknown>;

function getPath(root: Json, path: readonly string[]): unknown {
  return path.reduce<unknown>((node, key) => (node as Json | undefined)?.[key], root);
}

function setPath(root: Json, path: readonly string[], value: unknown): void {
  const parent = path.slice(0, -1).reduce((node, key) => {
    node[key] = { ...((node[key] as Json | undefined) ?? {}) };
    return node[key] as Json;
  }, root);
  parent[path[path.length - 1]] = value;
}

const quote = (text: string) => JSON.stringify(text.length > 40 ? `${text.slice(0, 40)}…` : text);

/** A comment line above the header written as one quoted cell (`"# name: value"`): its text, else null. */
function quotedComment(line: string): string | null {
  const text = line.trim();
  if (!text.startsWith('"#') || !text.endsWith('"') || text.length < 3) return null;
  const inner = text.slice(1, -1);
  return /^(?:[^"]|"")*$/.test(inner) ? inner.replaceAll('""', '"') : null;
}

/** The lines above the header: blank lines and comments, plain or quoted. */
function preambleLength(lines: readonly string[]): number {
  const i = lines.findIndex((raw) => {
    const text = raw.trim();
    return text !== '' && !text.startsWith('#') && quotedComment(text) === null;
  });
  return i < 0 ? lines.length : i;
}

/** Reads the `# name: value` lines above the header into `draft`; returns the line number of each setting. */
function readSettings(lines: readonly string[], draft: Json, issues: IssueList): Map<string, number> {
  const settingLines = new Map<string, number>();
  for (const [i, raw] of lines.slice(0, preambleLength(lines)).entries()) {
    const text = quotedComment(raw) ?? raw.trim();
    if (!text.startsWith('#')) continue;
    const match = SETTING_LINE.exec(text);
    const setting = match && CSV_SETTINGS.find((s) => s.name === match[1]);
    if (!match || !setting) continue;
    const value = match[2];
    const line = i + 1;
    settingLines.set(setting.path.join('.'), line);
    if (setting.kind === 'text') setPath(draft, setting.path, value);
    else if (!NUMBER.test(value)) issues.add({ line, message: `setting "${setting.name}": expected a number (got ${quote(value)})` });
    else if (setting.kind === 'number') setPath(draft, setting.path, Number(value));
    else setPath(draft, setting.path, { kind: 'atTime', minutes: Number(value) });
  }
  return settingLines;
}

/** Checks the header; returns the gauge keys. */
function readHeader(header: readonly string[], line: number, issues: IssueList): string[] {
  const names = header.map((h) => h.trim());
  READINGS_COLUMNS.forEach((expected, i) => {
    if (names[i]?.toLowerCase() !== expected)
      issues.add({ line, column: names[i], message: `column ${i + 1} must be "${expected}" (the header starts ${READINGS_COLUMNS.join(',')})` });
  });
  const keys = names.slice(READINGS_COLUMNS.length);
  if (keys.length === 0) issues.add({ line, message: 'no gauge columns after pressure_kpa' });
  if (keys.length > RECORD_LIMITS.gauges) issues.add({ line, message: `${keys.length} gauge columns; at most ${RECORD_LIMITS.gauges}` });
  keys.forEach((key, i) => {
    if (!GAUGE_KEY_PATTERN.test(key))
      issues.add({ line, column: key, message: 'a gauge column is named by its key: a letter, then up to 31 letters, digits, "_" or "-"' });
    else if (keys.indexOf(key) !== i) issues.add({ line, column: key, message: 'gauge column appears twice' });
  });
  return keys;
}

interface ParsedRow {
  fields: string[];
  line: number;
}

const csvErrorIssue = (error: CsvError): RecordIssue => ({ line: typeof error.lines === 'number' ? error.lines : 1, message: error.message });

/** Splits the CSV text into rows with their line numbers; syntax errors become issues, null when parsing could not go on. */
function parseRows(text: string, issues: IssueList): ParsedRow[] | null {
  const lines: number[] = [];
  try {
    const records = parse(text, {
      bom: true,
      comment: '#',
      comment_no_infix: true,
      skip_empty_lines: true,
      relax_column_count: true,
      max_record_size: 64 * 1024,
      skip_records_with_error: true,
      on_skip: (error) => {
        if (error) issues.add(csvErrorIssue(error));
        return undefined;
      },
      on_record: (fields, context) => {
        lines.push(context.lines);
        return fields;
      },
    });
    return records.map((fields, i) => ({ fields, line: lines[i] }));
  } catch (error) {
    issues.add(csvErrorIssue(error as CsvError));
    return null;
  }
}

/** A stage being assembled, with the CSV line of each of its readings. */
interface StageDraft {
  index: number;
  branch: string;
  targetKpa: number;
  firstLine: number;
  readings: { tMin: number; pressureKpa: number; gauges: Record<string, number> }[];
  lines: number[];
}

/** One data row's cells, or null when a cell is bad (each bad cell is reported). */
function readRow({ fields, line }: ParsedRow, keys: readonly string[], issues: IssueList) {
  const width = READINGS_COLUMNS.length + keys.length;
  if (fields.length !== width) {
    issues.add({ line, message: `has ${fields.length} fields, the header ${width}` });
    return null;
  }
  let bad = false;
  const report = (column: string, message: string) => {
    bad = true;
    issues.add({ line, column, message });
  };
  const cell = (i: number) => fields[i].trim();
  const number = (i: number, column: string) => {
    const value = cell(i);
    if (!NUMBER.test(value)) report(column, value === '' ? 'empty: expected a number' : `expected a number (got ${quote(value)})`);
    return Number(value);
  };
  if (!/^\d{1,5}$/.test(cell(0))) report('stage', `expected a whole number (got ${quote(cell(0))})`);
  const branch = cell(1);
  if (!(RECORD_BRANCHES as readonly string[]).includes(branch)) report('branch', `expected one of ${RECORD_BRANCHES.join(', ')} (got ${quote(branch)})`);
  const row = {
    index: Number(cell(0)),
    branch,
    targetKpa: number(2, 'target_kpa'),
    reading: {
      tMin: number(3, 't_min'),
      pressureKpa: number(4, 'pressure_kpa'),
      gauges: Object.fromEntries(keys.map((k, g) => [k, number(READINGS_COLUMNS.length + g, k)])),
    },
  };
  return bad ? null : row;
}

/** Groups the data rows into stages. A bad row is reported and left out, so that the other rows are still checked. */
function readStages(rows: readonly ParsedRow[], keys: readonly string[], issues: IssueList): StageDraft[] {
  const stages: StageDraft[] = [];
  const seen = new Set<number>();
  for (const parsed of rows) {
    const row = readRow(parsed, keys, issues);
    if (row === null) continue;
    const { line } = parsed;
    let stage = stages[stages.length - 1];
    if (stage?.index !== row.index) {
      if (seen.has(row.index)) {
        issues.add({ line, column: 'stage', message: `stage ${row.index} appears again after another stage: a stage's rows must be consecutive` });
        continue;
      }
      seen.add(row.index);
      stage = { index: row.index, branch: row.branch, targetKpa: row.targetKpa, firstLine: line, readings: [], lines: [] };
      stages.push(stage);
    } else if (row.branch !== stage.branch) {
      issues.add({ line, column: 'branch', message: `"${row.branch}" differs from the stage's first row (line ${stage.firstLine}: "${stage.branch}")` });
      continue;
    } else if (row.targetKpa !== stage.targetKpa) {
      issues.add({ line, column: 'target_kpa', message: `${row.targetKpa} differs from the stage's first row (line ${stage.firstLine}: ${stage.targetKpa})` });
      continue;
    }
    stage.readings.push(row.reading);
    stage.lines.push(line);
  }
  return stages;
}

/** Where a schema issue sits in the CSV: a reading's line and column, a stage's first line, or a setting's line. */
function locate(
  path: readonly PropertyKey[],
  stages: readonly StageDraft[],
  settingLines: Map<string, number>,
  headerLine: number,
): Pick<RecordIssue, 'line' | 'column'> {
  const [top, s, part, r, field, key] = path.map(String);
  const stage = top === 'stages' && s !== undefined ? stages[Number(s)] : undefined;
  if (stage && part === 'readings' && r !== undefined) {
    return { line: stage.lines[Number(r)], column: field === 'gauges' ? key : READING_FIELDS[field] };
  }
  if (stage) return { line: stage.firstLine, column: READING_FIELDS[part] };
  // The setting that wrote the field, else one in the same part of the record (e.g. another footing setting).
  const dotted = issueField(path);
  const setting = [...settingLines.keys()].find((p) => dotted.startsWith(p)) ?? [...settingLines.keys()].find((p) => p.startsWith(`${top}.`));
  return { line: setting === undefined ? headerLine : settingLines.get(setting) };
}

/**
 * Imports a readings CSV (header rules above) as a whole test record, all or nothing: the record, or
 * every problem with its line (and column), the first 100 listed with a count of the rest. `base` gives
 * what the CSV does not carry (the plate, if the CSV has no plate settings; gauge labels; events…).
 */
export function readingsCsvToRecord(text: string, base: RecordBase = {}): RecordImport {
  const issues = new IssueList();
  if (text.length > RECORD_LIMITS.bytes) {
    issues.add({ line: 1, message: `the text is longer than ${RECORD_LIMITS.bytes} characters` });
    return issues.failed();
  }
  const maxLines = RECORD_LIMITS.readingsTotal + 2000;
  const lines = text.split(/\r\n|\n|\r/, maxLines + 1);
  if (lines.length > maxLines) {
    issues.add({ line: maxLines + 1, message: `more than ${maxLines} lines: at most ${RECORD_LIMITS.readingsTotal} readings` });
    return issues.failed();
  }

  const draft: Json = { ...base, format: RECORD_FORMAT, version: RECORD_VERSION };
  const settingLines = readSettings(lines, draft, issues);
  // Quoted comments above the header are settings already read; blank them (keeping line numbers) for the parser.
  const top = preambleLength(lines);
  const quoted = lines.slice(0, top).some((l) => quotedComment(l) !== null);
  const rows = parseRows(quoted ? [...lines.slice(0, top).map(() => ''), ...lines.slice(top)].join('\n') : text, issues);
  if (rows === null) return issues.failed();
  const [header, ...data] = rows;
  if (header === undefined) {
    issues.add({ line: 1, message: 'no header: the CSV has no lines other than comments' });
    return issues.failed();
  }
  const beforeHeader = issues.size;
  const keys = readHeader(header.fields, header.line, issues);
  if (issues.size > beforeHeader) return issues.failed();
  const noPlate = getPath(draft, ['plate']) === undefined;
  if (noPlate)
    issues.add({ line: header.line, message: 'no plate: add "# plate_shape: square" (or circular) and "# plate_size_mm: 450" lines above the header' });
  const stages = readStages(data, keys, issues);
  if (data.length === 0 && issues.size === 0) issues.add({ line: header.line, message: 'no readings below the header' });
  if (stages.length === 0 || noPlate) return issues.failed();

  const known = (base.gauges ?? []).filter((g) => keys.includes(g.key));
  draft.gauges = keys.map((key) => known.find((g) => g.key === key) ?? { key });
  draft.stages = stages.map((s) => ({ index: s.index, branch: s.branch, targetKpa: s.targetKpa, readings: s.readings }));
  const record = validateRecord(draft, (path, message) => {
    const at = locate(path, stages, settingLines, header.line);
    issues.add({ ...at, message: at.column === undefined ? `${issueField(path)}: ${message}` : message });
  });
  return record === null || issues.size > 0 ? issues.failed() : { ok: true, record };
}

/**
 * A text cell a spreadsheet would run as a formula (OWASP CSV injection guidance), or one that already
 * begins with the apostrophe, which is led by another so that one apostrophe off always gives the text back.
 */
const FORMULA_START = /^[=+\-@\t\r']/;

/**
 * One cell of an exported CSV, safe to open in a spreadsheet: a finite number is written bare (so it stays
 * a number, negative ones included); anything else is text, always quoted with `"` doubled, and led by an
 * apostrophe when it begins with `=`, `+`, `-`, `@`, tab, CR or an apostrophe.
 */
export function csvCell(value: string | number | boolean): string {
  if (typeof value === 'number' && Number.isFinite(value)) return String(value);
  const text = String(value);
  return `"${(FORMULA_START.test(text) ? `'${text}` : text).replaceAll('"', '""')}"`;
}

/** Rows of cells as CSV text, one line each, ending in a newline. */
export const csvRows = (rows: readonly (readonly (string | number | boolean)[])[]) => rows.map((row) => `${row.map(csvCell).join(',')}\n`).join('');

/** A setting's value on one line: line breaks and other control characters become spaces. */
// biome-ignore lint/suspicious/noControlCharactersInRegex: control characters are what is replaced
const oneLine = (value: unknown) => String(value).replace(/[\u0000-\u001f\u007f\u2028\u2029]+/g, ' ');

/** The `# name: value` lines for the settings the record carries, each one quoted cell. */
function settingsPreamble(record: TestRecord): string[] {
  return CSV_SETTINGS.flatMap(({ name, path, kind }) => {
    const value = getPath(record as unknown as Json, path);
    if (value === undefined) return [];
    if (kind !== 'readAtMin') return [`# ${name}: ${oneLine(value)}`];
    const rule = value as ReductionRule;
    return rule.kind === 'atTime' ? [`# ${name}: ${rule.minutes}`] : [];
  });
}

/**
 * Every reading of the record as a readings CSV (header rules above), with the record's settings as
 * `# name: value` lines on top. Every text cell is quoted and neutralised ({@link csvCell}), the settings too.
 */
export function recordToReadingsCsv(record: TestRecord): string {
  const keys = record.gauges.map((g) => g.key);
  const rows = record.stages.flatMap((stage) =>
    stage.readings.map((r) => [stage.index, stage.branch, stage.targetKpa, r.tMin, r.pressureKpa, ...keys.map((k) => r.gauges[k])]),
  );
  const preamble = [`# ${RECORD_FORMAT} readings, version ${RECORD_VERSION}`, ...settingsPreamble(record)].map((line) => [line]);
  return csvRows([...preamble, [...READINGS_COLUMNS, ...keys], ...rows]);
}

/**
 * Reduced stage-end data as CSV: `stage,branch,t_min,pressure_kpa,settlement_mm,cut_short` and one column
 * per gauge (named by `gaugeKeys`; default g1, g2…). Settlement is the mean of the gauges, mm.
 */
export function stagePointsToCsv(points: readonly StagePoint[], gaugeKeys?: readonly string[]): string {
  const gaugeCount = Math.max(0, ...points.map((p) => p.gaugesMm.length));
  const keys = gaugeKeys ?? Array.from({ length: gaugeCount }, (_, i) => `g${i + 1}`);
  const rows = points.map((p) => [p.index, p.branch, p.tMin, p.pressureKpa, p.settlementMm, p.cutShort, ...p.gaugesMm]);
  return csvRows([['stage', 'branch', 't_min', 'pressure_kpa', 'settlement_mm', 'cut_short', ...keys], ...rows]);
}
