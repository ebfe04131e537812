import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';

/**
 * RFC 8785 (JSON Canonicalization Scheme) text of a value, by the `canonicalize` package: object keys
 * sorted by UTF-16 code units at every depth, no whitespace, numbers and strings as ECMAScript's
 * JSON.stringify writes them. The value is taken through JSON first (toJSON, undefined members dropped,
 * non-finite numbers null), so the text hashed is that of the JSON an export carries: anyone who
 * canonicalises the exported file gets the same bytes. Byte for byte what signatures made before the
 * package were hashed over (tests/server/canonical-json.test.ts).
 */
export function canonicalJson(value: unknown): string {
  const json = JSON.stringify(value);
  return json === undefined ? 'null' : (canonicalize(JSON.parse(json)) ?? 'null');
}

/** Lower-case hex SHA-256 of a value's canonical JSON (UTF-8). */
export const sha256Canonical = (value: unknown) => createHash('sha256').update(canonicalJson(value), 'utf8').digest('hex');
