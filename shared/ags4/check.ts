/**
 * The AGS4 rules (edition 4.1.1) that apply to a file of plate loading tests, checked on every import and
 * on every export before it is offered. Beyond the file shape read by {@link parseAgs4}: every heading in
 * the dictionary subset Settlescope knows or defined in DICT, in the dictionary's order with user-defined
 * headings last (rules 7, 9, 18); values matching their TYPE and UNIT (rule 8); KEY and REQUIRED headings
 * present and filled, keys unique, parents present PLTT → PLTG → LOCA → PROJ (rule 10); the PROJ, TRAN,
 * UNIT and TYPE groups present (rules 13, 14, 15, 17) with every unit and type used defined there, and
 * every abbreviation used defined in ABBR (rule 16). Groups outside the subset are checked for their shape
 * and values only, and listed as not used.
 */
import { GROUPS, type GroupDef, keysOf } from './dictionary';
import { type Ags4File, type Ags4Group, type Ags4Problem, cell, parseAgs4, ProblemList } from './parse';
import { typeDescription, valueProblem } from './values';

/** The outcome of checking a file: the parsed groups, the problems (the first 100 in line order, and how many more), the groups not used. */
export interface Ags4CheckResult {
  file: Ags4File;
  problems: Ags4Problem[];
  omitted: number;
  /** Groups outside the dictionary subset Settlescope knows, by name: read for their shape only. */
  ignoredGroups: string[];
}

/** A user-defined heading from the DICT group. */
interface UserHeading {
  group: string;
  heading: string;
  status: string;
}

function find(file: Ags4File, name: string): Ags4Group | undefined {
  return file.groups.find((g) => g.name === name && g.usable);
}

function columnValues(group: Ags4Group | undefined, heading: string): string[] {
  if (!group) return [];
  return group.rows.map((r) => cell(group, r, heading)).filter((v): v is string => v !== undefined);
}

function userHeadings(file: Ags4File): UserHeading[] {
  const dict = find(file, 'DICT');
  if (!dict) return [];
  return dict.rows
    .filter((r) => cell(dict, r, 'DICT_TYPE') === 'HEADING')
    .map((r) => ({ group: cell(dict, r, 'DICT_GRP') ?? '', heading: cell(dict, r, 'DICT_HDNG') ?? '', status: cell(dict, r, 'DICT_STAT') ?? '' }));
}

/** Rules 7, 9, 10a/b (presence), 18: the headings of a group the dictionary subset knows. */
function checkHeadings(group: Ags4Group, def: GroupDef, user: readonly UserHeading[], problems: ProblemList): void {
  const line = group.headerLines.heading;
  const known = def.headings.map((x) => x.name);
  const defined = user.filter((u) => u.group === group.name).map((u) => u.heading);
  let lastStandard = -1;
  let seenUser: string | null = null;
  for (const heading of group.headings) {
    const at = known.indexOf(heading);
    if (at >= 0) {
      if (at < lastStandard)
        problems.add({
          line,
          group: group.name,
          heading,
          rule: '7',
          message: `${heading} comes after ${known[lastStandard]}; the dictionary orders it before`,
        });
      if (seenUser)
        problems.add({
          line,
          group: group.name,
          heading,
          rule: '9',
          message: `the standard heading ${heading} comes after the user-defined ${seenUser}; user-defined headings go last`,
        });
      lastStandard = Math.max(lastStandard, at);
    } else if (defined.includes(heading)) seenUser ??= heading;
    else
      problems.add({
        line,
        group: group.name,
        heading,
        rule: '9',
        message: `${heading} is neither in the AGS4 dictionary for ${group.name} nor defined in the DICT group (rule 18)`,
      });
  }
  for (const x of def.headings) {
    if (x.status !== 'OTHER' && !group.headings.includes(x.name))
      problems.add({
        line,
        group: group.name,
        heading: x.name,
        rule: x.status === 'KEY' ? '10a' : '10b',
        message: `the ${x.status} heading ${x.name} is missing`,
      });
  }
}

/** Rules 10a/b (values), 10c: keys filled and unique, required values filled, parents present. */
function checkRows(group: Ags4Group, def: GroupDef, file: Ags4File, problems: ProblemList): void {
  const keys = keysOf(def).filter((k) => group.headings.includes(k));
  const required = def.headings.filter((x) => x.status !== 'OTHER' && group.headings.includes(x.name)).map((x) => x.name);
  const parentDef = def.parent ? GROUPS.get(def.parent) : undefined;
  const parent = def.parent ? find(file, def.parent) : undefined;
  if (parentDef && group.rows.length > 0 && !parent)
    problems.add({ line: group.line, group: group.name, rule: '10c', message: `the parent group ${parentDef.name} is missing` });
  const parentKeys = parentDef ? keysOf(parentDef).filter((k) => group.headings.includes(k)) : [];
  const parentSet = new Set(parent ? parent.rows.map((r) => parentKeys.map((k) => cell(parent, r, k) ?? '').join('\u0000')) : []);
  const seen = new Map<string, number>();
  for (const row of group.rows) {
    for (const heading of required) {
      if ((cell(group, row, heading) ?? '') === '')
        problems.add({
          line: row.line,
          group: group.name,
          heading,
          rule: keys.includes(heading) ? '10a' : '10b',
          message: `${heading} is empty; it must hold data`,
        });
    }
    const id = keys.map((k) => cell(group, row, k) ?? '').join('\u0000');
    const first = seen.get(id);
    if (first !== undefined)
      problems.add({
        line: row.line,
        group: group.name,
        heading: keys[keys.length - 1],
        rule: '10a',
        message: `duplicate key (${keys.join(', ')}) of line ${first}`,
      });
    else seen.set(id, row.line);
    if (parent && parentKeys.length > 0) {
      const parentId = parentKeys.map((k) => cell(group, row, k) ?? '').join('\u0000');
      if (!parentSet.has(parentId))
        problems.add({
          line: row.line,
          group: group.name,
          heading: parentKeys[parentKeys.length - 1],
          rule: '10c',
          message: `no ${parent.name} row with ${parentKeys.map((k) => `${k} "${cell(group, row, k)}"`).join(', ')}`,
        });
    }
  }
}

/** Rules 8, 15, 16, 17: every unit and type defined, values matching their type, abbreviations defined. */
function checkValues(group: Ags4Group, defined: { units: Set<string>; types: Set<string>; abbr: Set<string>; delimiter: string }, problems: ProblemList): void {
  group.headings.forEach((heading, i) => {
    const unit = group.units[i];
    const type = group.types[i];
    if (unit !== '' && !defined.units.has(unit))
      problems.add({ line: group.headerLines.unit, group: group.name, heading, rule: '15', message: `the unit "${unit}" is not defined in the UNIT group` });
    if (typeDescription(type) === null)
      problems.add({ line: group.headerLines.type, group: group.name, heading, rule: '8', message: `"${type}" is not an AGS4 data type` });
    else if (!defined.types.has(type))
      problems.add({ line: group.headerLines.type, group: group.name, heading, rule: '17', message: `the type "${type}" is not defined in the TYPE group` });
  });
  for (const row of group.rows) {
    row.values.forEach((value, i) => {
      const heading = group.headings[i];
      const type = group.types[i];
      const problem = valueProblem(value, type, group.units[i]);
      if (problem) problems.add({ line: row.line, group: group.name, heading, rule: '8', message: problem });
      else if (value !== '' && type === 'PA') {
        for (const code of value.split(defined.delimiter)) {
          if (!defined.abbr.has(`${heading}\u0000${code}`))
            problems.add({
              line: row.line,
              group: group.name,
              heading,
              rule: '16',
              message: `the abbreviation "${code}" is not defined in the ABBR group for ${heading}`,
            });
        }
      } else if (value !== '' && type === 'PU' && !defined.units.has(value))
        problems.add({ line: row.line, group: group.name, heading, rule: '15', message: `the unit "${value}" is not defined in the UNIT group` });
      else if (value !== '' && type === 'PT' && !defined.types.has(value))
        problems.add({ line: row.line, group: group.name, heading, rule: '17', message: `the type "${value}" is not defined in the TYPE group` });
    });
  }
}

/** Checks a parsed file against the rules that apply; adds every problem found to `problems`. Returns the groups not used. */
export function checkParsedAgs4(file: Ags4File, problems: ProblemList): string[] {
  for (const [name, rule] of [
    ['PROJ', '13'],
    ['TRAN', '14'],
    ['UNIT', '15'],
    ['TYPE', '17'],
  ] as const) {
    if (!file.groups.some((g) => g.name === name)) problems.add({ group: name, rule, message: `the ${name} group is missing; every AGS4 file has one` });
  }
  const tran = find(file, 'TRAN');
  const edition = tran?.rows[0] ? cell(tran, tran.rows[0], 'TRAN_AGS') : undefined;
  if (tran?.rows[0] && edition !== undefined && !/^4(\.\d+)*$/.test(edition))
    problems.add({ line: tran.rows[0].line, group: 'TRAN', heading: 'TRAN_AGS', rule: '14', message: `"${edition}" is not an AGS4 edition` });
  const proj = find(file, 'PROJ');
  if (proj && proj.rows.length !== 1)
    problems.add({ line: proj.line, group: 'PROJ', rule: '13', message: `the PROJ group holds ${proj.rows.length} rows; a file describes one project` });
  const abbr = find(file, 'ABBR');
  const defined = {
    units: new Set(columnValues(find(file, 'UNIT'), 'UNIT_UNIT')),
    types: new Set(columnValues(find(file, 'TYPE'), 'TYPE_TYPE')),
    abbr: new Set(abbr ? abbr.rows.map((r) => `${cell(abbr, r, 'ABBR_HDNG')}\u0000${cell(abbr, r, 'ABBR_CODE')}`) : []),
    delimiter: (tran?.rows[0] && cell(tran, tran.rows[0], 'TRAN_DLIM')) || '|',
  };
  const user = userHeadings(file);
  const ignored: string[] = [];
  for (const group of file.groups) {
    if (!group.usable) continue;
    checkValues(group, defined, problems);
    const def = GROUPS.get(group.name);
    if (!def) {
      ignored.push(group.name);
      continue;
    }
    checkHeadings(group, def, user, problems);
    checkRows(group, def, file, problems);
  }
  return ignored;
}

/** Parses and checks the text of an AGS4 file. */
export function checkAgs4(text: string): Ags4CheckResult {
  const problems = new ProblemList();
  const file = parseAgs4(text, problems);
  const ignoredGroups = checkParsedAgs4(file, problems);
  return { file, problems: problems.sorted(), omitted: problems.omitted, ignoredGroups };
}

/** One line per problem: `line 12, PLTT, PLTT_TIME: … (AGS4 rule 8)`. */
export function formatAgs4Problem(p: Ags4Problem): string {
  const where = [p.line === undefined ? null : `line ${p.line}`, p.group ?? null, p.heading ?? null].filter(Boolean).join(', ');
  const rule = p.rule === 'settlescope' ? '' : ` (AGS4 rule ${p.rule})`;
  return `${where ? `${where}: ` : ''}${p.message}${rule}`;
}
