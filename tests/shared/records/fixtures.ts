import { readFileSync } from 'node:fs';
import type { TestRecord } from '@shared/records/schema';
import { parseTestRecord } from '@shared/records/validate';
import { expect } from 'vitest';

export const FIXTURES = new URL('../../fixtures/records/', import.meta.url);

export const fixtureText = (name: string) => readFileSync(new URL(name, FIXTURES), 'utf8');

/** A checked-in example record, validated. */
export function fixtureRecord(name: string): TestRecord {
  const outcome = parseTestRecord(JSON.parse(fixtureText(name)));
  if (!outcome.ok) expect.fail(`${name}: ${JSON.stringify(outcome.errors)}`);
  return outcome.record;
}

/** A deep copy to break on purpose. */
export const copy = <T>(value: T): T => structuredClone(value);

/** The result of a finding that must apply. */
export function result<T>(finding: { applies: true; result: T } | { applies: false; reason: string }): T {
  if (!finding.applies) return expect.fail(`not applicable: ${finding.reason}`);
  return finding.result;
}

/** The reason of a finding that must not apply. */
export function reason(finding: { applies: true } | { applies: false; reason: string }): string {
  if (finding.applies) return expect.fail('expected the method not to apply');
  return finding.reason;
}
