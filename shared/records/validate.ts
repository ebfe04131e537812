import type { z } from 'zod';
import { checkConsistency, RECORD_LIMITS, type ReportIssue, readingSchema, recordHeadSchema, type TestRecord, tooManyReadings } from './schema';

/** One problem with an imported record: the field (dotted path) or the CSV line and column, and what is wrong. */
export interface RecordIssue {
  field?: string;
  line?: number;
  column?: string;
  message: string;
}

/** Outcome of an import: the whole record, or the problems found (the first {@link MAX_LISTED_ISSUES}, with a count of the rest). */
export type RecordImport = { ok: true; record: TestRecord } | { ok: false; errors: RecordIssue[]; omitted: number };

export const MAX_LISTED_ISSUES = 100;

/** Keeps the first {@link MAX_LISTED_ISSUES} problems and counts the rest, so that a file full of errors cannot fill memory with them. */
export class IssueList {
  readonly listed: RecordIssue[] = [];
  private count = 0;

  add(issue: RecordIssue): void {
    if (this.listed.length < MAX_LISTED_ISSUES) this.listed.push(issue);
    this.count++;
  }

  get size(): number {
    return this.count;
  }

  /** The failed import, problems in line order (CSV) or in the order found (JSON). */
  failed(): RecordImport {
    const errors = [...this.listed].sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
    return { ok: false, errors, omitted: this.count - this.listed.length };
  }
}

/** Dotted path of a problem, e.g. `stages.3.readings.12.gauges.g2`; `(record)` for the whole record. */
export function issueField(path: readonly PropertyKey[]): string {
  return path.length === 0 ? '(record)' : path.map(String).join('.');
}

/**
 * Validates a record piece by piece — the record without its readings, then each reading, then the rules
 * between fields — reporting every problem by its path. Each reading is checked on its own so that a
 * hostile file never makes more than one reading's problems at a time. Returns the record, or null.
 */
export function validateRecord(input: unknown, report: ReportIssue): TestRecord | null {
  let failed = false;
  const fail = (path: PropertyKey[], message: string) => {
    failed = true;
    report(
      path.map((p) => (typeof p === 'number' ? p : String(p))),
      message,
    );
  };
  const reportAll = (issues: readonly z.core.$ZodIssue[], prefix: (string | number)[] = []) => {
    for (const issue of issues) fail([...prefix, ...issue.path], issue.message);
  };

  const head = recordHeadSchema.safeParse(input);
  if (!head.success) reportAll(head.error.issues);
  const stages = (input as { stages?: unknown } | null)?.stages;
  const readingLists = Array.isArray(stages) ? stages.map((s) => (s as { readings?: unknown } | null)?.readings) : [];
  const total = readingLists.reduce<number>((n, list) => n + (Array.isArray(list) ? list.length : 0), 0);
  const tooMany = tooManyReadings(total);
  if (tooMany) fail(['stages'], tooMany);
  if (stages === undefined || !Array.isArray(stages) || stages.length > RECORD_LIMITS.stages || tooMany) return null;

  const readings = readingLists.map((list, s) => {
    if (!Array.isArray(list) || list.length > RECORD_LIMITS.readingsPerStage) return [];
    return list.map((reading, r) => {
      const parsed = readingSchema.safeParse(reading);
      if (parsed.success) return parsed.data;
      reportAll(parsed.error.issues, ['stages', s, 'readings', r]);
      return null;
    });
  });
  if (failed || !head.success) return null;

  const record = {
    ...head.data,
    stages: head.data.stages.map((stage, s) => ({ ...stage, readings: readings[s] as TestRecord['stages'][number]['readings'] })),
  };
  checkConsistency(record, fail);
  return failed ? null : record;
}

/** Validates parsed JSON as a test record: the record, or the problems naming their fields. */
export function parseTestRecord(input: unknown): RecordImport {
  const issues = new IssueList();
  const record = validateRecord(input, (path, message) => issues.add({ field: issueField(path), message }));
  return record === null ? issues.failed() : { ok: true, record };
}

/** One line per problem: `field: message` or `line 7, column "t_min": message`. */
export function formatIssue(issue: RecordIssue): string {
  const where = [
    issue.line === undefined ? null : `line ${issue.line}`,
    issue.column === undefined ? null : `column "${issue.column}"`,
    issue.field ?? null,
  ].filter(Boolean);
  return where.length === 0 ? issue.message : `${where.join(', ')}: ${issue.message}`;
}
