/** A column of a plain-text table: its header and which side its cells hug. */
export interface TextColumn {
  header: string;
  /** Default 'left'; numbers read best 'right'. */
  align?: 'left' | 'right';
}

/** Plain-text table with aligned columns, two spaces apart, no trailing spaces. */
export function textTable(columns: readonly TextColumn[], rows: readonly (readonly string[])[]): string {
  const widths = columns.map((c, i) => Math.max(c.header.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: readonly string[]) =>
    columns
      .map((c, i) => ((c.align ?? 'left') === 'right' ? (cells[i] ?? '').padStart(widths[i]) : (cells[i] ?? '').padEnd(widths[i])))
      .join('  ')
      .trimEnd();
  return [line(columns.map((c) => c.header)), ...rows.map(line)].join('\n');
}

/** A number with fixed decimals, or "—" when there is none. */
export function fixed(value: number | null | undefined, digits: number): string {
  return value === null || value === undefined ? '—' : value.toFixed(digits);
}
