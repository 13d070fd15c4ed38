// Small factories for API tests: build rows straight in the test database.
import bcrypt from 'bcryptjs';
import type { Role } from '@shared/schemas/user';
import { Project, ProjectMember, User } from '../../backend/src/models';

let seq = 0;
export const TEST_PASSWORD = 'test-password-123';
const hash = bcrypt.hashSync(TEST_PASSWORD, 4);

export async function buildUser(attrs: { role?: Role; email?: string; name?: string; active?: boolean } = {}): Promise<User> {
  seq += 1;
  const role = attrs.role ?? 'planner';
  return User.create({
    email: attrs.email ?? `${role}${seq}-${process.pid}@example.test`,
    name: attrs.name ?? `Test ${role} ${seq}`,
    role,
    active: attrs.active ?? true,
    passwordHash: hash,
  });
}

export async function buildProject(attrs: { createdBy?: number | null; name?: string; members?: User[] } = {}): Promise<Project> {
  seq += 1;
  const p = await Project.create({
    name: attrs.name ?? `Project ${seq}`,
    clientName: 'Fernhill Biscuit Works',
    siteName: 'Packing hall',
    description: '',
    createdBy: attrs.createdBy ?? null,
  });
  for (const m of attrs.members ?? []) await ProjectMember.create({ projectId: p.id, userId: m.id });
  return p;
}

/** An arm model row (params as given; routes validate, the table does not). */
export async function buildArmModel(attrs: { name?: string; family?: string; params?: Record<string, unknown>; builtIn?: boolean } = {}) {
  seq += 1;
  const { ArmModel } = await import('../../backend/src/models');
  return ArmModel.create({
    name: attrs.name ?? `Test arm ${seq}-${process.pid}`,
    family: attrs.family ?? 'scara',
    params: attrs.params ?? { family: 'scara', innerLink: 350, outerLink: 250, strokeMin: 0, strokeMax: 200, axes: [{ min: -150, max: 150 }, { min: -145, max: 145 }] },
    builtIn: attrs.builtIn ?? false,
    createdBy: null,
  });
}
