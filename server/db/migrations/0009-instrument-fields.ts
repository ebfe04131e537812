import { type QueryInterface, QueryTypes } from 'sequelize';

/*
 * Repairs the instrument register. Until this migration the model shared one attribute object between
 * rangeMin, rangeMax, resolution and travelMm, so all four were written to and read from `range_min`:
 * on every write the last of them (in that order) that was written won, and the other three columns
 * stayed NULL.
 *
 * What can be recovered, and how:
 * - Instruments registered through the API: every value exactly. Each create and update left an audit
 *   entry with what the user entered (the record as it stood in memory after the write), so the
 *   history is replayed. A replay whose resulting `range_min` differs from the column is not trusted.
 * - Instruments with no audit history (the demo seed, rows written outside the API): only the travel,
 *   which is what `range_min` holds after a create. Range min, range max and resolution were never
 *   stored and cannot be recovered; they stay NULL and the notes say so, to be re-entered from the
 *   instrument's certificate.
 * - Updated instruments whose create was not audited: the fields each update changed; the rest as above.
 * Rows whose range_max, resolution or travel_mm hold a value were not written by the faulty model and
 * are left alone.
 */

export const INSTRUMENT_FIELDS = ['rangeMin', 'rangeMax', 'resolution', 'travelMm'] as const;
type Field = (typeof INSTRUMENT_FIELDS)[number];
/** undefined: not known. */
export type Recovered = Record<Field, number | null | undefined>;

/** One audit entry of an instrument: its action and the field-by-field diff it stored. */
export interface InstrumentAudit {
  action: string;
  changes: Record<string, { from: unknown; to: unknown }>;
}

const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/**
 * Replays an instrument's audit history (oldest first) through the faulty mapping: what the user last
 * entered for each field, or undefined where the history cannot say. `stored` is the `range_min`
 * column now; a replay that ends elsewhere is discarded.
 */
export function recoverInstrumentFields(history: readonly InstrumentAudit[], stored: number | null): Recovered {
  const unknown: Recovered = { rangeMin: undefined, rangeMax: undefined, resolution: undefined, travelMm: undefined };
  const told: Recovered = { ...unknown };
  // The value of the shared column; every field read back as it.
  let column: number | null | undefined;
  let created = false;
  for (const entry of history) {
    const changed = INSTRUMENT_FIELDS.filter((f) => f in entry.changes);
    if (entry.action === 'created') {
      created = true;
      // A field absent from a create diff was entered as null (null → null is no change).
      for (const f of INSTRUMENT_FIELDS) told[f] = num(entry.changes[f]?.to);
      column = told.travelMm;
    } else if (entry.action === 'updated') {
      // Every field read back as the column, so a changed field's `from` is the column's value, and an
      // unchanged field was entered as that same value. Only the changed fields were written.
      if (column === undefined && changed.length > 0) column = num(entry.changes[changed[0]].from);
      for (const f of INSTRUMENT_FIELDS) told[f] = changed.includes(f) ? num(entry.changes[f].to) : column;
      if (changed.length > 0) column = told[changed[changed.length - 1]];
    }
  }
  if (history.every((e) => e.action !== 'updated') && !created) return { ...unknown, travelMm: stored };
  if (column !== undefined && column !== stored) return unknown;
  return told;
}

const LOST_NOTE = 'Range, resolution or travel may have been lost by a storage fault (repaired in 2026-12); check them against the certificate.';

export async function up(qi: QueryInterface): Promise<void> {
  const rows = (await qi.sequelize.query('SELECT id, range_min AS stored, notes FROM instruments WHERE range_max IS NULL AND resolution IS NULL AND travel_mm IS NULL', {
    type: QueryTypes.SELECT,
  })) as { id: number; stored: number | null; notes: string }[];
  for (const row of rows) {
    const audits = (await qi.sequelize.query("SELECT action, changes FROM audit_log WHERE entity = 'instrument' AND entity_id = ? ORDER BY id", {
      replacements: [String(row.id)],
      type: QueryTypes.SELECT,
    })) as { action: string; changes: unknown }[];
    const history = audits.map((a) => ({ action: a.action, changes: (typeof a.changes === 'string' ? JSON.parse(a.changes) : a.changes) as InstrumentAudit['changes'] }));
    const r = recoverInstrumentFields(history, row.stored);
    const lost = INSTRUMENT_FIELDS.some((f) => r[f] === undefined);
    const notes = lost && !row.notes.includes(LOST_NOTE) ? (row.notes ? `${row.notes}\n${LOST_NOTE}` : LOST_NOTE) : row.notes;
    await qi.sequelize.query('UPDATE instruments SET range_min = ?, range_max = ?, resolution = ?, travel_mm = ?, notes = ? WHERE id = ?', {
      replacements: [r.rangeMin ?? null, r.rangeMax ?? null, r.resolution ?? null, r.travelMm ?? null, notes, row.id],
    });
  }
}

/** Nothing to undo: the repaired columns are what the old model meant to store. */
export async function down(): Promise<void> {}
