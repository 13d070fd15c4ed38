import type { Sequelize } from 'sequelize';
import { Acknowledgement } from './Acknowledgement';
import { ArmModel } from './ArmModel';
import { AuditEvent } from './AuditEvent';
import { FloorPlan } from './FloorPlan';
import { Invitation } from './Invitation';
import { Layout } from './Layout';
import { MailDelivery } from './MailDelivery';
import { MailMessage } from './MailMessage';
import { Project } from './Project';
import { ProjectLayerRoles } from './ProjectLayerRoles';
import { ProjectMember } from './ProjectMember';
import { ReviewComment } from './ReviewComment';
import { Revision } from './Revision';
import { SnapshotFloorPlan } from './SnapshotFloorPlan';
import { User } from './User';

export { ArmModel, AuditEvent, FloorPlan, Layout, MailMessage, Project, ProjectMember, User };
export { Acknowledgement, Invitation, MailDelivery, ReviewComment, Revision, SnapshotFloorPlan };
export { ProjectLayerRoles };
export { presentProject } from './Project';
export { presentUser } from './User';

let initialisedOn: Sequelize | null = null;

/** Initialises every model and association on one Sequelize instance (once per process). */
export function initModels(sequelize: Sequelize): void {
  if (initialisedOn === sequelize) return;
  if (initialisedOn) throw new Error('initModels: models are already bound to another Sequelize instance');
  initialisedOn = sequelize;
  User.initModel(sequelize);
  Project.initModel(sequelize);
  ProjectMember.initModel(sequelize);
  AuditEvent.initModel(sequelize);
  FloorPlan.initModel(sequelize);
  ArmModel.initModel(sequelize);
  Layout.initModel(sequelize);
  MailMessage.initModel(sequelize);
  Revision.initModel(sequelize);
  SnapshotFloorPlan.initModel(sequelize);
  ReviewComment.initModel(sequelize);
  Acknowledgement.initModel(sequelize);
  Invitation.initModel(sequelize);
  MailDelivery.initModel(sequelize);
  ProjectLayerRoles.initModel(sequelize);

  Project.belongsTo(User, { as: 'creator', foreignKey: 'createdBy' });
  Project.belongsToMany(User, { as: 'members', through: ProjectMember, foreignKey: 'projectId', otherKey: 'userId' });
  User.belongsToMany(Project, { as: 'projects', through: ProjectMember, foreignKey: 'userId', otherKey: 'projectId' });
  AuditEvent.belongsTo(User, { as: 'actor', foreignKey: 'actorId' });
  FloorPlan.belongsTo(Project, { foreignKey: 'projectId' });
  Layout.belongsTo(Project, { foreignKey: 'projectId' });
  Layout.belongsTo(FloorPlan, { as: 'floorPlan', foreignKey: 'floorPlanId' });
}
