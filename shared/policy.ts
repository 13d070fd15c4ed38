import type { Role } from './schemas/user';

/**
 * Who may do what — the single policy table the routes (and the UI, to hide what a role cannot
 * do) consult. Project visibility for clients (membership) is checked where the project is loaded.
 */
export const POLICY = {
  'project.read': ['admin', 'planner', 'reviewer', 'client'],
  'project.readAll': ['admin', 'planner', 'reviewer'],
  'project.write': ['admin', 'planner'],
  'project.members': ['admin', 'planner'],
  /** Archive: hidden from lists and read-only; restoring is for admins. */
  'project.archive': ['admin', 'planner'],
  'project.restore': ['admin'],
  'user.list': ['admin', 'planner'],
  'user.manage': ['admin'],
  'audit.read': ['admin'],
  'armModel.read': ['admin', 'planner', 'reviewer', 'client'],
  'armModel.write': ['admin', 'planner'],
  'floorPlan.read': ['admin', 'planner', 'reviewer', 'client'],
  'floorPlan.write': ['admin', 'planner'],
  'layout.read': ['admin', 'planner', 'reviewer'],
  'layout.write': ['admin', 'planner'],
  'layout.archive': ['admin', 'planner'],
  'layout.restore': ['admin'],
  'kinematics.use': ['admin', 'planner', 'reviewer', 'client'],
  'safeguarding.use': ['admin', 'planner', 'reviewer', 'client'],
  /** Clients read only released revisions of their member projects (checked where loaded). */
  'revision.read': ['admin', 'planner', 'reviewer', 'client'],
  /** Unreleased revisions, comments, decisions and draft sheets: staff only. */
  'revision.readDrafts': ['admin', 'planner', 'reviewer'],
  'revision.submit': ['admin', 'planner'],
  /** Reviewers only: admins manage people, they do not sign off safety reviews. */
  'revision.decide': ['reviewer'],
  'revision.release': ['admin', 'planner'],
  'revision.acknowledge': ['client'],
  'comment.write': ['admin', 'planner', 'reviewer'],
  'mail.read': ['admin'],
  'invite.manage': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof POLICY;

/** True when the role may perform the action. */
export function can(role: Role | undefined | null, action: Action): boolean {
  return role != null && (POLICY[action] as readonly Role[]).includes(role);
}
