import type { Transaction } from 'sequelize';
import { AuditEntry } from '../models/audit-entry';
import { transaction } from '../db/transaction';

type Plain = Record<string, unknown>;

/** Field-by-field difference of two plain records: `{field: {from, to}}` for each changed field. */
export function diff(before: Plain | null, after: Plain | null): Record<string, { from: unknown; to: unknown }> {
  const out: Record<string, { from: unknown; to: unknown }> = {};
  const keys = new Set([...Object.keys(before ?? {}), ...Object.keys(after ?? {})]);
  for (const k of keys) {
    if (k === 'updatedAt' || k === 'createdAt' || k === 'passwordHash') continue;
    const from = before?.[k] ?? null;
    const to = after?.[k] ?? null;
    if (JSON.stringify(from) !== JSON.stringify(to)) out[k] = { from, to };
  }
  return out;
}

export interface AuditInput {
  userId: number | null;
  entity: string;
  entityId: string | number;
  action: string;
  before?: object | null;
  after?: object | null;
  reason?: string | null;
}

/** Appends one audit entry, inside the caller's transaction so the change and its record land together. */
export async function audit(input: AuditInput, transaction?: Transaction): Promise<void> {
  await AuditEntry.create(
    {
      at: new Date(),
      userId: input.userId,
      entity: input.entity,
      entityId: String(input.entityId),
      action: input.action,
      changes: diff((input.before ?? null) as Plain | null, (input.after ?? null) as Plain | null),
      reason: input.reason ?? null,
    },
    { transaction },
  );
}

/** Runs `change` and its audit entry in one transaction: both land or neither does. */
export function audited<T>(change: (t: Transaction) => Promise<T>, entry: (result: T) => AuditInput): Promise<T> {
  return transaction(async (t) => {
    const result = await change(t);
    await audit(entry(result), t);
    return result;
  });
}
