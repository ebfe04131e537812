/**
 * Writes an AGS4 file (edition 4.1.1): every field in double quotes (a quote inside doubled), fields
 * separated by commas, CR+LF line ends, a blank line between groups, each group's GROUP, HEADING, UNIT and
 * TYPE rows before its DATA rows. The UNIT and TYPE groups are made from the units and types the file
 * uses, the DICT group from the user-defined headings, and the ABBR group from the abbreviations given.
 */
import { GROUPS, type HeadingDef, UNIT_DESCRIPTIONS } from './dictionary';
import { typeDescription, formatNumber } from './values';

export type Ags4Value = string | number | null | undefined;

/** One group to write: its columns (dictionary headings first, then user-defined ones) and rows by heading. */
export interface Ags4Table {
  group: string;
  columns: readonly HeadingDef[];
  /** Headings the dictionary does not have; they are written last and defined in DICT. */
  userColumns?: readonly HeadingDef[];
  rows: readonly Record<string, Ags4Value>[];
}

/** An abbreviation used in a PA column, for the ABBR group. */
export interface Ags4Abbreviation {
  heading: string;
  code: string;
  description: string;
}

/** The dictionary's definition of a heading of a group (throws for a heading the subset does not know). */
export function dictionaryColumn(group: string, heading: string): HeadingDef {
  const def = GROUPS.get(group)?.headings.find((x) => x.name === heading);
  if (!def) throw new Error(`${group}.${heading} is not in the dictionary subset`);
  return def;
}

/** The dictionary's headings of a group, in its order, limited to those named. */
export function dictionaryColumns(group: string, headings: readonly string[]): HeadingDef[] {
  const def = GROUPS.get(group);
  if (!def) throw new Error(`${group} is not in the dictionary subset`);
  for (const name of headings) dictionaryColumn(group, name);
  return def.headings.filter((x) => headings.includes(x.name));
}

const PRINTABLE = /^[ -~]*$/;

/** A field in double quotes with inner quotes doubled (AGS4 rule 5). */
export function quoteField(text: string): string {
  if (!PRINTABLE.test(text)) throw new Error(`not printable ASCII: ${JSON.stringify(text)}`);
  return `"${text.replace(/"/g, '""')}"`;
}

function writeValue(value: Ags4Value, column: HeadingDef): string {
  if (value === null || value === undefined) return '';
  return typeof value === 'number' ? formatNumber(value, column.type) : value;
}

function groupLines(table: Ags4Table): string[] {
  const columns = [...table.columns, ...(table.userColumns ?? [])];
  const row = (descriptor: string, fields: readonly string[]) => [descriptor, ...fields].map(quoteField).join(',');
  return [
    row('GROUP', [table.group]),
    row(
      'HEADING',
      columns.map((c) => c.name),
    ),
    row(
      'UNIT',
      columns.map((c) => c.unit),
    ),
    row(
      'TYPE',
      columns.map((c) => c.type),
    ),
    ...table.rows.map((r) =>
      row(
        'DATA',
        columns.map((c) => writeValue(r[c.name], c)),
      ),
    ),
  ];
}

function housekeeping(group: string, headings: readonly string[], rows: Record<string, Ags4Value>[]): Ags4Table {
  return { group, columns: dictionaryColumns(group, headings), rows };
}

/**
 * The whole file: PROJ and TRAN as given, then UNIT, TYPE, ABBR and DICT made from what the file uses,
 * then the other groups in the order given. Text values must already be printable ASCII.
 */
export function writeAgs4(tables: readonly Ags4Table[], abbreviations: readonly Ags4Abbreviation[] = []): string {
  const first = tables.filter((t) => t.group === 'PROJ' || t.group === 'TRAN');
  const rest = tables.filter((t) => t.group !== 'PROJ' && t.group !== 'TRAN');
  const dictRows = tables.flatMap((t) =>
    (t.userColumns ?? []).map((c) => ({
      DICT_TYPE: 'HEADING',
      DICT_GRP: t.group,
      DICT_HDNG: c.name,
      DICT_STAT: c.status,
      DICT_DTYP: c.type,
      DICT_DESC: c.description,
      DICT_UNIT: c.unit,
      DICT_PGRP: GROUPS.get(t.group)?.parent ?? '',
    })),
  );
  const abbr = abbreviations.length
    ? [
        housekeeping(
          'ABBR',
          ['ABBR_HDNG', 'ABBR_CODE', 'ABBR_DESC', 'ABBR_LIST'],
          abbreviations.map((a) => ({ ABBR_HDNG: a.heading, ABBR_CODE: a.code, ABBR_DESC: a.description, ABBR_LIST: 'AGS4' })),
        ),
      ]
    : [];
  const dict = dictRows.length
    ? [housekeeping('DICT', ['DICT_TYPE', 'DICT_GRP', 'DICT_HDNG', 'DICT_STAT', 'DICT_DTYP', 'DICT_DESC', 'DICT_UNIT', 'DICT_PGRP'], dictRows)]
    : [];
  const typeHeadings = ['TYPE_TYPE', 'TYPE_DESC'];
  const unitHeadings = ['UNIT_UNIT', 'UNIT_DESC'];
  // The TYPE and UNIT groups use types themselves (X): count them before listing.
  const described = [...first, ...abbr, ...dict, housekeeping('TYPE', typeHeadings, []), housekeeping('UNIT', unitHeadings, []), ...rest];
  const columns = described.flatMap((t) => [...t.columns, ...(t.userColumns ?? [])]);
  const types = [...new Set(columns.map((c) => c.type))].sort();
  const units = [...new Set(columns.map((c) => c.unit).filter((u) => u !== ''))];
  const typeTable = housekeeping(
    'TYPE',
    typeHeadings,
    types.map((t) => ({ TYPE_TYPE: t, TYPE_DESC: typeDescription(t) ?? t })),
  );
  const unitTable = housekeeping(
    'UNIT',
    unitHeadings,
    units.map((u) => ({ UNIT_UNIT: u, UNIT_DESC: UNIT_DESCRIPTIONS[u] ?? u })),
  );
  const ordered = [...first, unitTable, typeTable, ...abbr, ...dict, ...rest];
  return `${ordered.map((t) => groupLines(t).join('\r\n')).join('\r\n\r\n')}\r\n`;
}
