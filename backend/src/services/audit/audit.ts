import type { Transaction } from 'sequelize';
import { AuditEvent } from '../../models';

/** Records one audit event (inside the caller's transaction when given). */
export async function audit(
  actorId: number | null,
  action: string,
  entity: string,
  entityId: string | number | null,
  details: Record<string, unknown> = {},
  transaction?: Transaction,
): Promise<void> {
  await AuditEvent.create(
    { actorId, action, entity, entityId: entityId == null ? null : String(entityId), details },
    { transaction },
  );
}
