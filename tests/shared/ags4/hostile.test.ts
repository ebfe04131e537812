/**
 * Hostile or broken AGS4 text never makes the reader throw: random text, and the export of the fixture
 * tests with random characters deleted, replaced or inserted, always end in records or in a list of
 * problems (at most 100 listed, the rest counted), each naming an AGS4 rule.
 */
import { importAgs4 } from '@shared/ags4/plate-import';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fixtureFile } from './fixtures';

const good = fixtureFile().text;
const pieces = ['"', ',', '\r\n', '\n', '""', '"GROUP","PLTT"', '"HEADING"', '"DATA"', '"UNIT"', '"TYPE"', 'PLTG_', '1.2', 'x', '°', ' '];

function survives(text: string): void {
  const outcome = importAgs4(text);
  if (outcome.ok) {
    expect(outcome.tests.length).toBeGreaterThan(0);
    return;
  }
  expect(outcome.problems.length).toBeGreaterThan(0);
  expect(outcome.problems.length).toBeLessThanOrEqual(100);
  for (const p of outcome.problems) expect(p.rule).toMatch(/^(\d+[a-c]?|settlescope)$/);
}

describe('AGS4 import of hostile text', () => {
  it('random text made of AGS4 pieces', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...pieces), { maxLength: 400 }), (parts) => survives(parts.join(''))),
      { numRuns: 300 },
    );
  }, 60_000);

  it('the export with random edits', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.nat(good.length - 1), fc.constantFrom('', ...pieces)), { minLength: 1, maxLength: 8 }), (edits) => {
        let text = good;
        for (const [at, insert] of edits) text = text.slice(0, at % text.length) + insert + text.slice((at % text.length) + (insert === '' ? 1 : 0));
        survives(text);
      }),
      { numRuns: 80 },
    );
  }, 60_000);
});
