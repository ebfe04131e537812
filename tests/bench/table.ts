/** The benchmark's printed table: one row per figure, with its target, baseline and verdict. */
export interface Row {
  id: string;
  figure: string;
  measured: string;
  target: string;
  baseline: string;
  /** 'met', 'MISSED', 'ERROR', 'not run' or an explanation. */
  verdict: string;
}

const HEADERS: Row = { id: '#', figure: 'figure', measured: 'measured', target: 'target', baseline: 'baseline (same run)', verdict: 'verdict' };
const COLUMNS = Object.keys(HEADERS) as (keyof Row)[];

export function renderTable(rows: readonly Row[]): string {
  const all = [HEADERS, ...rows];
  const widths = COLUMNS.map((c) => Math.max(...all.map((r) => r[c].length)));
  const line = (r: Row) => `| ${COLUMNS.map((c, i) => r[c].padEnd(widths[i])).join(' | ')} |`;
  const rule = `|${widths.map((w) => '-'.repeat(w + 2)).join('|')}|`;
  return [line(HEADERS), rule, ...rows.map(line)].join('\n') + '\n';
}

export const verdict = (ok: boolean) => (ok ? 'met' : 'MISSED');
