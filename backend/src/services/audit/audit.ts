import type { Transaction } from 'sequelize';
import type { AuditAction, AuditEntity } from '@shared/audit';
import { AuditEvent } from '../../models';

/**
 * Records one audit event (inside the caller's transaction when given), at `at` when the caller
 * keeps its own clock, else now. Only actions and item kinds the audit words name (shared/audit)
 * can be recorded, so every event reads in words on the admin page.
 */
export async function audit(
  actorId: number | null,
  action: AuditAction,
  entity: AuditEntity,
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
