/**
 * The per-run sample journal on local disk: every accepted sample is appended here first (in small
 * batches, flushed to disk), and only then archived to MariaDB. After a crash the unarchived tail
 * is read back and archived again; the (run, seq) key makes that idempotent. Segment files are
 * deleted once every sample in them is archived.
 */
import { closeSync, existsSync, fdatasyncSync, mkdirSync, openSync, readFileSync, readdirSync, rmSync, writeFileSync, writeSync } from 'node:fs';
import path from 'node:path';
import type { SampleRow, SampleStatusCode } from '../../shared/runs/samples';

export interface JournalOptions {
  dir: string;
  runId: number;
  /** Samples per segment file. Default 50,000. */
  segmentSize?: number;
}

const encode = (r: SampleRow) => JSON.stringify([r.seq, r.tMs, r.channel, r.raw, r.value, r.status]);

function decode(line: string): SampleRow | null {
  try {
    const a = JSON.parse(line);
    if (!Array.isArray(a) || a.length !== 6 || !Number.isSafeInteger(a[0]) || !Number.isFinite(a[1])) return null;
    return { seq: a[0], tMs: a[1], channel: a[2], raw: a[3], value: a[4], status: a[5] as SampleStatusCode };
  } catch {
    return null; // a torn last line after a crash
  }
}

export class Journal {
  private readonly dir: string;
  private readonly segmentSize: number;
  private fd: number | null = null;
  private segment = -1;
  private archivedSeq: number;
  /** The last append failed, perhaps halfway through a line. */
  private torn = false;

  constructor(options: JournalOptions) {
    this.dir = path.join(options.dir, `run-${options.runId}`);
    this.segmentSize = options.segmentSize ?? 50_000;
    mkdirSync(this.dir, { recursive: true });
    this.archivedSeq = this.readCheckpoint();
  }

  /** Highest sequence number known to be in the database. */
  get archivedUpTo(): number {
    return this.archivedSeq;
  }

  /**
   * Appends rows (in seq order) and forces them to disk before returning. Throws when the disk
   * refuses them (full, gone): nothing of `rows` counts as written, and the next append reopens the
   * segment and starts on a fresh line, so retried rows are read back whole (a repeat is harmless).
   */
  append(rows: SampleRow[]): void {
    if (rows.length === 0) return;
    try {
      let start = 0;
      while (start < rows.length) {
        const seg = Math.floor(rows[start].seq / this.segmentSize);
        if (seg !== this.segment) this.openSegment(seg);
        let end = start;
        while (end < rows.length && Math.floor(rows[end].seq / this.segmentSize) === seg) end++;
        // After a failed write, a blank line first: a torn line from it ends there (blank lines are skipped).
        writeSync(this.fd!, `${this.torn ? '\n' : ''}${rows.slice(start, end).map(encode).join('\n')}\n`);
        this.torn = false;
        start = end;
      }
      fdatasyncSync(this.fd!);
    } catch (err) {
      this.torn = true;
      this.close();
      throw err;
    }
  }

  /** Records that everything up to `seq` is archived, and deletes fully archived segments. */
  markArchived(seq: number): void {
    if (seq <= this.archivedSeq) return;
    this.archivedSeq = seq;
    writeFileSync(path.join(this.dir, 'archived'), String(seq));
    for (const { file, index } of this.segments()) {
      if ((index + 1) * this.segmentSize - 1 <= seq && index !== this.segment) rmSync(path.join(this.dir, file), { force: true });
    }
  }

  /** Every journaled row not yet archived, in seq order (used after a restart). */
  unarchived(): SampleRow[] {
    const rows: SampleRow[] = [];
    for (const { file } of this.segments()) {
      for (const line of readFileSync(path.join(this.dir, file), 'utf8').split('\n')) {
        const row = line ? decode(line) : null;
        if (row && row.seq > this.archivedSeq) rows.push(row);
      }
    }
    return rows.sort((a, b) => a.seq - b.seq);
  }

  /** Highest sequence number in the journal, or the archived one when the journal is empty. */
  lastSeq(): number {
    const rows = this.unarchived();
    return rows.length ? rows[rows.length - 1].seq : this.archivedSeq;
  }

  close(): void {
    if (this.fd !== null) closeSync(this.fd);
    this.fd = null;
    this.segment = -1;
  }

  /** Removes the journal once the run is closed and fully archived. */
  destroy(): void {
    this.close();
    rmSync(this.dir, { recursive: true, force: true });
  }

  private openSegment(index: number): void {
    this.close();
    this.fd = openSync(path.join(this.dir, `seg-${String(index).padStart(8, '0')}.ndjson`), 'a');
    this.segment = index;
  }

  private segments(): { file: string; index: number }[] {
    if (!existsSync(this.dir)) return [];
    return readdirSync(this.dir)
      .filter((f) => /^seg-\d{8}\.ndjson$/.test(f))
      .map((file) => ({ file, index: Number(file.slice(4, 12)) }))
      .sort((a, b) => a.index - b.index);
  }

  private readCheckpoint(): number {
    const file = path.join(this.dir, 'archived');
    return existsSync(file) ? Number(readFileSync(file, 'utf8')) || 0 : 0;
  }
}
