/**
 * Reads an AGS4 file (edition 4.1.1) into its groups, keeping the line number of every row, and notes
 * the problems with the file's shape on the way: characters (rule 1), CR+LF line ends (rule 2a), the
 * GROUP, HEADING, UNIT and TYPE rows in that order (rule 2b), data descriptors (rule 3), field counts
 * (rule 4), quoting (rule 5) and separators (rule 6), group and heading names (rule 19). Rule numbers are
 * those of the AGS4 rules of the edition named.
 */
import { MAX_LISTED_ISSUES } from '../records/validate';

/** One problem with an AGS4 file: where (line, group, heading), which AGS4 rule, and what is wrong. */
export interface Ags4Problem {
  line?: number;
  group?: string;
  heading?: string;
  /** The AGS4 rule, e.g. "8" or "10c", or "settlescope" for what a test record needs beyond AGS4. */
  rule: string;
  message: string;
}

/** Keeps the first {@link MAX_LISTED_ISSUES} problems and counts the rest, so a hostile file cannot fill memory. */
export class ProblemList {
  readonly listed: Ags4Problem[] = [];
  private count = 0;

  add(problem: Ags4Problem): void {
    if (this.listed.length < MAX_LISTED_ISSUES) this.listed.push(problem);
    this.count++;
  }

  get size(): number {
    return this.count;
  }

  get omitted(): number {
    return this.count - this.listed.length;
  }

  /** The listed problems in line order (problems without a line last). */
  sorted(): Ags4Problem[] {
    return [...this.listed].sort((a, b) => (a.line ?? Number.MAX_SAFE_INTEGER) - (b.line ?? Number.MAX_SAFE_INTEGER));
  }
}

export interface Ags4Row {
  line: number;
  values: string[];
}

export interface Ags4Group {
  name: string;
  line: number;
  headings: string[];
  units: string[];
  types: string[];
  /** Lines of the HEADING, UNIT and TYPE rows. */
  headerLines: { heading: number; unit: number; type: number };
  rows: Ags4Row[];
  /** The header rows were all read; rows of an unusable group are not checked further. */
  usable: boolean;
}

export interface Ags4File {
  groups: Ags4Group[];
}

export const GROUP_NAME = /^[A-Z0-9]{1,4}$/;
export const HEADING_NAME = /^[A-Z0-9]{1,4}_[A-Z0-9]{1,4}$/;

/** One line split into its quoted fields, or why it cannot be (rules 5 and 6). */
export function splitLine(text: string): { fields: string[] } | { problem: string } {
  const fields: string[] = [];
  let at = 0;
  for (;;) {
    if (text[at] !== '"') return { problem: `field ${fields.length + 1} is not enclosed in double quotes` };
    let value = '';
    let i = at + 1;
    for (;;) {
      const close = text.indexOf('"', i);
      if (close < 0) return { problem: `field ${fields.length + 1} has no closing double quote` };
      value += text.slice(i, close);
      if (text[close + 1] === '"') {
        value += '"';
        i = close + 2;
        continue;
      }
      at = close + 1;
      break;
    }
    fields.push(value);
    if (at === text.length) return { fields };
    if (text[at] !== ',') return { problem: `field ${fields.length} is followed by "${text[at]}" instead of a comma` };
    at++;
  }
}

const DESCRIPTORS = ['GROUP', 'HEADING', 'UNIT', 'TYPE', 'DATA'] as const;
type Descriptor = (typeof DESCRIPTORS)[number];

/** Character problems of one line: anything but printable ASCII (rule 1). */
function nonAscii(text: string): string | null {
  const bad = [...text].find((c) => c < ' ' || c > '~');
  if (bad === undefined) return null;
  const code = bad.codePointAt(0)!;
  return `holds ${code < 32 || code === 127 ? `the control character U+${code.toString(16).padStart(4, '0').toUpperCase()}` : `"${bad}" (U+${code.toString(16).padStart(4, '0').toUpperCase()})`}; AGS4 files hold printable ASCII only`;
}

/**
 * Splits an AGS4 file into groups. Rows after a broken header are skipped (their group is unusable);
 * every other problem is listed and reading goes on, so that one pass names them all.
 */
export function parseAgs4(text: string, problems: ProblemList): Ags4File {
  const groups: Ags4Group[] = [];
  const seen = new Map<string, number>();
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;
  if (body !== text) problems.add({ line: 1, rule: '1', message: 'starts with a byte-order mark; AGS4 files hold printable ASCII only' });
  const lines = body.split('\n');
  if (lines[lines.length - 1] === '') lines.pop();
  let current: Ags4Group | null = null;
  let expect: Descriptor = 'GROUP';
  let broken = false;
  let lineEndsReported = 0;

  const endGroup = (group: Ags4Group) => {
    if (expect !== 'DATA' && !broken) problems.add({ line: group.line, group: group.name, rule: '2b', message: `the group has no ${expect} row` });
    else if (group.usable && group.rows.length === 0) problems.add({ line: group.line, group: group.name, rule: '2', message: 'the group has no DATA rows' });
  };

  lines.forEach((raw, i) => {
    const line = i + 1;
    const isLast = i === lines.length - 1 && !body.endsWith('\n');
    let text = raw;
    if (text.endsWith('\r')) text = text.slice(0, -1);
    else if (!isLast && lineEndsReported++ < 3) problems.add({ line, rule: '2a', message: 'ends with a bare line feed; AGS4 lines end with CR+LF' });
    if (text.includes('\r')) problems.add({ line, rule: '2a', message: 'holds a carriage return inside the line; AGS4 lines end with CR+LF' });
    const chars = nonAscii(text.replace(/\r/g, ''));
    if (chars) problems.add({ line, group: current?.name, rule: '1', message: `the line ${chars}` });
    if (text.trim() === '') {
      if (current && expect !== 'DATA' && !broken)
        problems.add({ line, group: current.name, rule: '2b', message: `blank line where the ${expect} row belongs` });
      return;
    }
    const split = splitLine(text);
    if ('problem' in split) {
      problems.add({ line, group: current?.name, rule: '5', message: split.problem });
      if (expect !== 'DATA' && expect !== 'GROUP') broken = true;
      return;
    }
    const [descriptor, ...fields] = split.fields;
    if (!(DESCRIPTORS as readonly string[]).includes(descriptor)) {
      problems.add({ line, group: current?.name, rule: '3', message: `"${descriptor}" is not a data descriptor (GROUP, HEADING, UNIT, TYPE or DATA)` });
      return;
    }
    if (descriptor === 'GROUP') {
      if (current) endGroup(current);
      const name = fields[0] ?? '';
      if (fields.length !== 1) problems.add({ line, group: name, rule: '4', message: 'a GROUP row holds the descriptor and the group name only' });
      if (!GROUP_NAME.test(name))
        problems.add({ line, group: name, rule: '19', message: `"${name}" is not a group name (at most 4 upper-case letters and digits)` });
      if (seen.has(name)) problems.add({ line, group: name, rule: '2', message: `the group ${name} appears again (first on line ${seen.get(name)})` });
      else seen.set(name, line);
      current = { name, line, headings: [], units: [], types: [], headerLines: { heading: 0, unit: 0, type: 0 }, rows: [], usable: false };
      groups.push(current);
      expect = 'HEADING';
      broken = false;
      return;
    }
    if (!current) {
      problems.add({ line, rule: '2b', message: `a ${descriptor} row before any GROUP row` });
      return;
    }
    const group = current as Ags4Group;
    if (broken) return;
    if (descriptor !== expect && !(expect === 'DATA' && descriptor === 'DATA')) {
      problems.add({
        line,
        group: group.name,
        rule: '2b',
        message: `a ${descriptor} row where the ${expect} row belongs (GROUP, HEADING, UNIT, TYPE, then DATA)`,
      });
      if (expect !== 'DATA') broken = true;
      return;
    }
    if (descriptor === 'HEADING') {
      group.headings = fields;
      group.headerLines.heading = line;
      fields.forEach((name, k) => {
        if (!HEADING_NAME.test(name))
          problems.add({
            line,
            group: group.name,
            heading: name,
            rule: '19a',
            message: `"${name}" is not a heading name (a group name, "_", then up to 4 upper-case letters or digits; 9 characters at most)`,
          });
        if (fields.indexOf(name) !== k)
          problems.add({ line, group: group.name, heading: name, rule: '2b', message: 'the heading appears twice in the HEADING row' });
      });
      expect = 'UNIT';
      return;
    }
    if (fields.length !== group.headings.length) {
      problems.add({
        line,
        group: group.name,
        rule: '4',
        message: `${fields.length} fields after the descriptor; the HEADING row has ${group.headings.length}`,
      });
      if (descriptor !== 'DATA') broken = true;
      return;
    }
    if (descriptor === 'UNIT') {
      group.units = fields;
      group.headerLines.unit = line;
      expect = 'TYPE';
    } else if (descriptor === 'TYPE') {
      group.types = fields;
      group.headerLines.type = line;
      group.usable = true;
      expect = 'DATA';
    } else group.rows.push({ line, values: fields });
  });
  if (current) endGroup(current);
  return { groups };
}

/** The value of a heading in a row, or undefined when the group has no such heading. */
export function cell(group: Ags4Group, row: Ags4Row, heading: string): string | undefined {
  const at = group.headings.indexOf(heading);
  return at < 0 ? undefined : row.values[at];
}
