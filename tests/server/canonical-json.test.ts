/**
 * The sign-off hash's canonical JSON: RFC 8785 through the `canonicalize` package, shown to give byte for
 * byte the text every earlier signature was hashed over (the home-made serialiser, kept frozen in
 * canonical-json-earlier.ts as the reference), so signatures made before the package still verify.
 */
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../server/services/canonical-json';
import { earlierCanonicalJson } from './canonical-json-earlier';

const recordsDir = path.join(import.meta.dirname, '../fixtures/records');

describe('RFC 8785 canonical JSON', () => {
  it('gives the RFC’s own examples', () => {
    // RFC 8785 §3.2.2 (sorting, whitespace, ES number and string serialisation); recalled from memory.
    const input = JSON.parse(
      '{ "numbers": [333333333.33333329, 1E30, 4.50, 2e-3, 0.000000000000000000000000001],\n' +
        '  "string": "\\u20ac$\\u000F\\u000aA\'\\u0042\\u0022\\u005c\\\\\\"\\/",\n' +
        '  "literals": [null, true, false] }',
    );
    expect(canonicalJson(input)).toBe('{"literals":[null,true,false],"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27],"string":"€$\\u000f\\nA\'B\\"\\\\\\\\\\"/"}');
    // RFC 8785 §3.2.3: keys sort by UTF-16 code units (a surrogate pair before U+FB33).
    const keys = ['\u20ac', '\r', '\ufb33', '1', '\ud83d\ude00', '\u0080', '\u00f6'];
    expect(canonicalJson(Object.fromEntries(keys.map((k) => [k, 0])))).toBe('{"\\r":0,"1":0,"\u0080":0,"\u00f6":0,"\u20ac":0,"\ud83d\ude00":0,"\ufb33":0}');
  });

  it('is byte for byte the earlier text for every example record', () => {
    const files = readdirSync(recordsDir).filter((f) => f.endsWith('.json'));
    expect(files.length).toBeGreaterThanOrEqual(2);
    for (const file of files) {
      const record = JSON.parse(readFileSync(path.join(recordsDir, file), 'utf8'));
      const text = canonicalJson(record);
      expect(text.length).toBeGreaterThan(1000);
      expect(text, file).toBe(earlierCanonicalJson(record));
    }
  });

  it('is byte for byte the earlier text for any JSON value, and for what the server hashes before it is JSON (dates, undefined members, NaN)', () => {
    const extra = fc.oneof(fc.date({ noInvalidDate: true }), fc.constant(undefined), fc.constant(Number.NaN), fc.constant(-0), fc.double());
    const value = fc.letrec((tie) => ({
      node: fc.oneof({ depthSize: 'small' }, fc.jsonValue(), extra, fc.array(tie('node'), { maxLength: 5 }), fc.dictionary(fc.string({ unit: 'binary' }), tie('node'), { maxKeys: 5 })),
    })).node;
    fc.assert(
      fc.property(value, (v) => canonicalJson(v) === earlierCanonicalJson(v)),
      { numRuns: 2000 },
    );
  });
});
