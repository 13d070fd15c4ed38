import type { Sequelize, Transaction } from 'sequelize';
import type { Role } from '@shared/schemas/user';
import { hashPassword } from '../auth/passport';
import { Project, ProjectMember, User } from '../models';
import { audit } from '../services/audit/audit';
import { readDemoHistory, type DemoHistory } from './demoHistory';

export const DEMO_PASSWORD = 'ringfence-demo';

/** The demo accounts of the invented Fernhill scenario (README lists them). */
export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; name: string; role: Role }> = [
  { email: 'admin@fernhill.test', name: 'Morgan Hale', role: 'admin' },
  { email: 'planner@fernhill.test', name: 'Priya Lindqvist', role: 'planner' },
  { email: 'reviewer@fernhill.test', name: 'Tomasz Adeyemi', role: 'reviewer' },
  { email: 'client@fernhill.test', name: 'Harriet Fenwick', role: 'client' },
];

export const DEMO_PROJECT = {
  name: 'Line 3 end-of-line cell',
  clientName: 'Fernhill Biscuit Works',
  siteName: 'Fernhill bakery, packing hall',
  description:
    'End-of-line cell for biscuit line 3: two SCARA-type pickers over the wrapper infeed, an articulated arm packing cases, ' +
    'a linkage-driven palletizer at the end of the line, one guard fence with an access opening and an operator area at the pallet exchange.',
};

/** What a seed step gets: the seed's transaction, the demo accounts by role, the project, and the demo's history (samples/demo-history.json). */
export interface SeedContext {
  sequelize: Sequelize;
  transaction: Transaction;
  planner: User;
  accounts: ReadonlyMap<Role, User>;
  project: Project;
  history: DemoHistory;
}

/** Extra seeding steps later features register (catalogue, floor plan, layout, its review); run in order inside the seed. */
export type SeedStep = (ctx: SeedContext) => Promise<void>;

/** Seeds the demo when the database has no users; returns true when it seeded. Its history is dated back from `now`. */
export async function seedDemoIfEmpty(sequelize: Sequelize, opts: { bcryptCost: number; steps?: SeedStep[]; now?: Date }): Promise<boolean> {
  if ((await User.count()) > 0) return false;
  const hash = await hashPassword(DEMO_PASSWORD, opts.bcryptCost);
  const history = readDemoHistory(opts.now ?? new Date());
  // silent: the rows carry the history's times, not the time of seeding.
  const dated = (at: Date) => ({ createdAt: at, updatedAt: at });
  await sequelize.transaction(async (transaction) => {
    const users = new Map<Role, User>();
    for (const a of DEMO_ACCOUNTS) {
      users.set(a.role, await User.create({ ...a, passwordHash: hash, ...dated(history.accountsCreated) }, { transaction, silent: true }));
    }
    const planner = users.get('planner')!;
    const project = await Project.create({ ...DEMO_PROJECT, createdBy: planner.id, ...dated(history.projectCreated) }, { transaction, silent: true });
    await ProjectMember.create({ projectId: project.id, userId: users.get('client')!.id, createdAt: history.projectCreated }, { transaction });
    await audit(null, 'demo.seed', 'project', project.id, {}, transaction);
    for (const step of opts.steps ?? []) await step({ sequelize, transaction, planner, accounts: users, project, history });
  });
  return true;
}
