/**
 * The canonical JSON signatures were hashed with before the RFC 8785 package, kept verbatim as the
 * reference the package's output is compared with (canonical-json.test.ts, signoff.test.ts).
 */
export function earlierCanonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined || typeof v === 'function' ? 'null' : earlierCanonicalJson(v))).join(',')}]`;
  if (typeof (value as { toJSON?: unknown }).toJSON === 'function') return earlierCanonicalJson((value as { toJSON(): unknown }).toJSON());
  const entries = Object.keys(value)
    .sort()
    .filter((k) => {
      const v = (value as Record<string, unknown>)[k];
      return v !== undefined && typeof v !== 'function';
    })
    .map((k) => `${JSON.stringify(k)}:${earlierCanonicalJson((value as Record<string, unknown>)[k])}`);
  return `{${entries.join(',')}}`;
}

