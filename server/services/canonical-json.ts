import { createHash } from 'node:crypto';

/**
 * JSON with every object's keys in sorted order (code-unit order) and no whitespace, so that equal data
 * always gives the same text. Values JSON drops (undefined, functions) are dropped here too; non-finite
 * numbers become null as in JSON.stringify.
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined || typeof v === 'function' ? 'null' : canonicalJson(v))).join(',')}]`;
  if (typeof (value as { toJSON?: unknown }).toJSON === 'function') return canonicalJson((value as { toJSON(): unknown }).toJSON());
  const entries = Object.keys(value)
    .sort()
    .filter((k) => {
      const v = (value as Record<string, unknown>)[k];
      return v !== undefined && typeof v !== 'function';
    })
    .map((k) => `${JSON.stringify(k)}:${canonicalJson((value as Record<string, unknown>)[k])}`);
  return `{${entries.join(',')}}`;
}

/** Lower-case hex SHA-256 of a value's canonical JSON (UTF-8). */
export const sha256Canonical = (value: unknown) => createHash('sha256').update(canonicalJson(value), 'utf8').digest('hex');
