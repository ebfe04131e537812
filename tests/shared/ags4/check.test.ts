/**
 * The AGS4 checker (edition 4.1.1) on Settlescope's own export and on broken copies of it. Each case
 * names the AGS4 rule it breaks, by the rule numbers of the AGS4 data format's rules: 1 printable ASCII,
 * 2a CR+LF, 2b GROUP/HEADING/UNIT/TYPE rows in order, 4 field counts, 5 double quotes, 7 dictionary
 * order, 8 values per TYPE, 9/18 headings in the dictionary or DICT, 10a unique keys, 10c parents,
 * 13/14/15/17 the PROJ, TRAN, UNIT and TYPE groups, 16 abbreviations in ABBR.
 */
import { checkAgs4, formatAgs4Problem } from '@shared/ags4/check';
import { importAgs4 } from '@shared/ags4/plate-import';
import { describe, expect, it } from 'vitest';
import { fixtureFile, lineOf, withLine } from './fixtures';

const good = fixtureFile().text;
const firstPltt = lineOf(good, (l) => l.startsWith('"DATA","PLT-07","0.50","R1","1","1"'));

function problemsOf(text: string) {
  const checked = checkAgs4(text);
  return checked.problems;
}

/** Swaps two columns throughout one group. */
function swapColumns(text: string, group: string, a: string, b: string): string {
  const lines = text.split('\r\n');
  const start = lines.indexOf(`"GROUP","${group}"`);
  const headings = lines[start + 1].split('","');
  const [i, j] = [headings.indexOf(a), headings.indexOf(b)];
  for (let k = start + 1; k < lines.length && lines[k] !== ''; k++) {
    const fields = lines[k].slice(1, -1).split('","');
    [fields[i], fields[j]] = [fields[j], fields[i]];
    lines[k] = `"${fields.join('","')}"`;
  }
  return lines.join('\r\n');
}

describe('the export of the fixture tests passes every AGS4 check', () => {
  it('has no problems, names edition 4.1.1 in TRAN and ends every line with CR+LF', () => {
    const checked = checkAgs4(good);
    expect(checked.problems.map(formatAgs4Problem)).toEqual([]);
    expect(checked.ignoredGroups).toEqual([]);
    expect(good).toContain('"TRAN_AGS"');
    expect(good).toMatch(/"4\.1\.1"/);
    expect(good.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
    expect(good).toMatch(/^[ -~\r\n]*$/);
  });
});

describe('refusing broken AGS4, each problem named by line, group and heading', () => {
  it('a group without its TYPE row (rule 2b)', () => {
    const typeLine = lineOf(good, (l) => l.startsWith('"TYPE","ID","2DP","X","X","X","1DP"'));
    const text = withLine(good, typeLine, () => '');
    expect(problemsOf(text)).toContainEqual(expect.objectContaining({ group: 'PLTT', rule: '2b', message: expect.stringMatching(/TYPE row/) }));
  });

  it('a file without the TYPE group (rule 17): the group and every type used are named', () => {
    const start = lineOf(good, (l) => l === '"GROUP","TYPE"');
    const lines = good.split('\r\n');
    const end = lines.indexOf('', start);
    const text = [...lines.slice(0, start - 1), ...lines.slice(end + 1)].join('\r\n');
    const problems = problemsOf(text);
    expect(problems).toContainEqual(expect.objectContaining({ group: 'TYPE', rule: '17', message: expect.stringMatching(/TYPE group is missing/) }));
    expect(problems).toContainEqual(
      expect.objectContaining({ group: 'PLTT', heading: 'PLTT_TIME', rule: '17', message: expect.stringMatching(/"1DP" is not defined/) }),
    );
  });

  it('wrong decimal places (rule 8)', () => {
    const text = withLine(good, firstPltt, (l) => l.replace('"5.7","0.18"', '"5.7","0.180"'));
    expect(problemsOf(text)).toEqual([
      expect.objectContaining({ line: firstPltt, group: 'PLTT', heading: 'PLTT_SET1', rule: '8', message: expect.stringMatching(/exactly 2 decimal places/) }),
    ]);
  });

  it('an orphan PLTT row whose PLTG does not exist (rule 10c)', () => {
    const text = withLine(good, firstPltt, (l) => l.replace('"R1"', '"R9"'));
    expect(problemsOf(text)).toEqual([
      expect.objectContaining({ line: firstPltt, group: 'PLTT', rule: '10c', message: expect.stringMatching(/no PLTG row with .*PLTG_TESN "R9"/) }),
    ]);
  });

  it('duplicate keys (rule 10a), naming the first line', () => {
    const text = withLine(good, firstPltt, (l) => `${l}\r\n${l}`);
    expect(problemsOf(text)).toEqual([
      expect.objectContaining({
        line: firstPltt + 1,
        group: 'PLTT',
        rule: '10a',
        message: `duplicate key (LOCA_ID, PLTG_DPTH, PLTG_TESN, PLTG_CYC, PLTT_STG, PLTT_TIME) of line ${firstPltt}`,
      }),
    ]);
  });

  it('a character outside printable ASCII (rule 1)', () => {
    const text = withLine(good, firstPltt, (l) => l.replace('"loading"', '"loading °"'));
    expect(problemsOf(text)).toEqual([
      expect.objectContaining({ line: firstPltt, group: 'PLTT', rule: '1', message: expect.stringMatching(/"°" \(U\+00B0\)/) }),
    ]);
  });

  it('bare LF line ends (rule 2a) and an unquoted field (rule 5)', () => {
    expect(problemsOf(good.replace(/\r\n/g, '\n'))[0]).toMatchObject({ line: 1, rule: '2a' });
    const unquoted = withLine(good, firstPltt, (l) => l.replace('"5.7"', '5.7'));
    expect(problemsOf(unquoted)).toEqual([expect.objectContaining({ line: firstPltt, rule: '5', message: 'field 8 is not enclosed in double quotes' })]);
  });

  it('a unit not in UNIT (rule 15), a heading in neither the dictionary nor DICT (rule 9), an abbreviation not in ABBR (rule 16)', () => {
    const unitLine = lineOf(good, (l) => l.startsWith('"UNIT","","m","","","","min","kN"'));
    const unknownUnit = withLine(good, unitLine, (l) => l.replace('"min","kN"', '"min","kgf"'));
    expect(problemsOf(unknownUnit)).toContainEqual(expect.objectContaining({ line: unitLine, group: 'PLTT', heading: 'PLTT_LOAD', rule: '15' }));
    const headingLine = unitLine - 1;
    const unknownHeading = withLine(good, headingLine, (l) => l.replace('"PLTT_MSET"', '"PLTT_XXXX"'));
    expect(problemsOf(unknownHeading)).toEqual([expect.objectContaining({ line: headingLine, group: 'PLTT', heading: 'PLTT_XXXX', rule: '9' })]);
    const locaLine = lineOf(good, (l) => l.startsWith('"DATA","PLT-07","TP"'));
    const unknownCode = withLine(good, locaLine, (l) => l.replace('"TP"', '"XX"'));
    expect(problemsOf(unknownCode)).toEqual([expect.objectContaining({ line: locaLine, group: 'LOCA', heading: 'LOCA_TYPE', rule: '16' })]);
  });

  it('a group without DATA rows (rule 2), here ABBR, which also leaves LOCA_TYPE "TP" undefined (rule 16)', () => {
    const abbrData = lineOf(good, (l) => l.startsWith('"DATA","LOCA_TYPE","TP"'));
    const lines = good.split('\r\n');
    lines.splice(abbrData - 1, 1);
    const problems = problemsOf(lines.join('\r\n'));
    expect(problems).toContainEqual(expect.objectContaining({ group: 'ABBR', rule: '2', message: 'the group has no DATA rows' }));
    expect(problems).toContainEqual(expect.objectContaining({ group: 'LOCA', heading: 'LOCA_TYPE', rule: '16' }));
  });

  it('headings out of the dictionary order (rule 7)', () => {
    const text = swapColumns(good, 'PLTG', 'PLTG_PDIA', 'PLTG_SEAT');
    expect(problemsOf(text)).toEqual([expect.objectContaining({ group: 'PLTG', heading: 'PLTG_PDIA', rule: '7' })]);
  });

  it('a file with several problems names every one of them, and the import stores nothing from it', () => {
    let text = withLine(good, firstPltt, (l) => l.replace('"5.7","0.18"', '"5.7","0.180"'));
    text = withLine(text, firstPltt + 1, (l) => l.replace('"R1"', '"R9"'));
    text = withLine(text, firstPltt + 2, (l) => l.replace('"loading"', '"loading é"'));
    text = withLine(text, firstPltt + 3, (l) => `${l}\r\n${l}`);
    const outcome = importAgs4(text);
    expect(outcome.ok).toBe(false);
    if (outcome.ok) return;
    expect(outcome.problems.map((p) => [p.line, p.rule])).toEqual([
      [firstPltt, '8'],
      [firstPltt + 1, '10c'],
      [firstPltt + 2, '1'],
      [firstPltt + 4, '10a'],
    ]);
  });
});
