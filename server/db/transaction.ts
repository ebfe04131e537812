import type { Transaction } from 'sequelize';
import { AuditEntry } from '../models/audit-entry';

/** A managed transaction on the application's Sequelize instance (the one the models were initialised on). */
export function transaction<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
  return AuditEntry.sequelize!.transaction(fn);
}
