import type { Transaction } from 'sequelize';
import { AuditEvent } from '../../models';

/** Records one audit event (inside the caller's transaction when given), at `at` when the caller keeps its own clock, else now. */
export async function audit(
  actorId: number | null,
  action: string,
  entity: string,
  entityId: string | number | null,
  details: Record<string, unknown> = {},
  transaction?: Transaction,
  at?: Date,
): Promise<void> {
  await AuditEvent.create(
    { actorId, action, entity, entityId: entityId == null ? null : String(entityId), details, ...(at ? { at } : {}) },
    { transaction },
  );
}
