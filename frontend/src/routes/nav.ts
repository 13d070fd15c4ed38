import type { Action } from '@shared/policy';

/** One entry of the main navigation. */
export interface NavItem {
  /** The visible label, also the link's accessible name. */
  label: string;
  to: string;
  /** Shown only to roles that may do this (see shared/policy.ts); everyone when omitted. */
  requires?: Action;
}

/**
 * The main navigation, in display order. A new page adds its entry here and its route in
 * `routeTable.tsx` (e.g. `{label: 'Arm catalogue', to: '/arm-models', requires: 'armModel.read'}`
 * once that page exists).
 */
export const NAV: NavItem[] = [
  { label: 'Projects', to: '/projects', requires: 'project.read' },
  { label: 'Arm catalogue', to: '/catalogue', requires: 'armModel.read' },
  { label: 'People', to: '/admin/users', requires: 'user.manage' },
  { label: 'Invitations', to: '/admin/invitations', requires: 'invite.manage' },
  { label: 'Audit log', to: '/admin/audit', requires: 'audit.read' },
  { label: 'Mail outbox', to: '/admin/mail', requires: 'mail.read' },
];
