import type { Role } from '@shared/schemas/user';
import { cn } from '../lib/cn';

const ROLE_CLASS: Record<Role, string> = {
  admin: 'text-role-admin border-role-admin/50',
  planner: 'text-role-planner border-role-planner/50',
  reviewer: 'text-role-reviewer border-role-reviewer/50',
  client: 'text-role-client border-role-client/50',
};

/** Human labels of the roles (docs/product.md "Roles"). */
export const ROLE_LABEL: Record<Role, string> = {
  admin: 'Admin',
  planner: 'Planner',
  reviewer: 'Reviewer',
  client: 'Client',
};

/** A small outlined tag naming a role. */
export function RoleBadge({ role, className }: { role: Role; className?: string }) {
  return (
    <span
      className={cn(
        'inline-flex h-5 items-center rounded-control border bg-paper-raised px-1.5 text-[0.6875rem] font-bold tracking-wider uppercase',
        ROLE_CLASS[role],
        className,
      )}
    >
      {ROLE_LABEL[role]}
    </span>
  );
}
