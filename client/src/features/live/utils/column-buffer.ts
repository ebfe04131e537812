/** Options of {@link createColumnBuffer}. */
export interface ColumnBufferOptions {
  /** Number of parallel columns (e.g. 2 for time and value). */
  columns: number;
  /** Most rows kept; memory is `columns × capacity × 8` bytes, allocated once. Default 200,000. */
  capacity?: number;
}

/**
 * Columnar rows in preallocated Float64Arrays, oldest first, with bounded memory. When full it
 * halves its resolution (keeps every second row and always the newest) instead of dropping the
 * oldest, so a long hold still shows from its start. Columns are read through `column(i)`: a
 * subarray view, no copy, valid until the next push.
 */
export function createColumnBuffer({ columns, capacity = 200_000 }: ColumnBufferOptions) {
  if (!Number.isInteger(columns) || columns < 1) throw new RangeError('"columns" must be a positive integer');
  if (!Number.isInteger(capacity) || capacity < 4) throw new RangeError('"capacity" must be an integer of at least 4');
  const data = Array.from({ length: columns }, () => new Float64Array(capacity));
  let length = 0;
  /** How many rows each kept row stands for, after decimation. */
  let stride = 1;

  function decimate() {
    // Keep rows 0, 2, 4, …; the newest row is then pushed after them as usual.
    const kept = Math.ceil(length / 2);
    for (const col of data) for (let i = 1; i < kept; i++) col[i] = col[2 * i];
    length = kept;
    stride *= 2;
  }

  return {
    push(...values: number[]): void {
      if (length === capacity) decimate();
      for (let c = 0; c < columns; c++) data[c][length] = values[c];
      length++;
    },
    column(c: number): Float64Array {
      return data[c].subarray(0, length);
    },
    /** First row index whose value in column `c` is ≥ `value` (column must be ascending). */
    lowerBound(c: number, value: number): number {
      const col = data[c];
      let lo = 0;
      let hi = length;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (col[mid] < value) lo = mid + 1;
        else hi = mid;
      }
      return lo;
    },
    get length() {
      return length;
    },
    get capacity() {
      return capacity;
    },
    get stride() {
      return stride;
    },
    clear(): void {
      length = 0;
      stride = 1;
    },
  };
}

export type ColumnBuffer = ReturnType<typeof createColumnBuffer>;
