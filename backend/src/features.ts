import type { Router } from 'express';
import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import { seedDemoCatalogue } from './db/demoCatalogue';
import { seedDemoFloorPlan } from './db/demoFloorPlan';
import { seedDemoLayout } from './db/demoLayout';
import type { SeedStep } from './db/seed';
import { adminAuditRouter } from './routes/adminAudit';
import { adminMailRouter } from './routes/adminMail';
import { armModelsRouter } from './routes/armModels';
import { commentsRouter } from './routes/comments';
import { floorPlansRouter } from './routes/floorPlans';
import { invitationsRouter } from './routes/invitations';
import { kinematicsRouter } from './routes/kinematics';
import { layoutsRouter } from './routes/layouts';
import { planSheetsRouter } from './routes/planSheets';
import { revisionsRouter } from './routes/revisions';
import { safeguardingRouter } from './routes/safeguarding';
import type { Mailer } from './services/mail/mailer';

export interface FeatureContext {
  config: Config;
  sequelize: Sequelize;
  /** Outgoing mail (review, release, invitations); without it those mails are recorded as failed. */
  mailer?: Mailer;
  /** The clock of time-limited things (invitation expiry); tests move it. */
  now?: () => Date;
}

/** API routers of the product's features, mounted under /api after the foundation routes. */
export function featureRouters(ctx: FeatureContext): Router[] {
  return [
    floorPlansRouter(ctx.sequelize, { uploadLimitBytes: ctx.config.uploadLimitBytes }),
    layoutsRouter(ctx.sequelize),
    armModelsRouter(ctx.sequelize),
    kinematicsRouter(),
    safeguardingRouter(),
    planSheetsRouter(),
    revisionsRouter(ctx),
    commentsRouter(ctx),
    invitationsRouter(ctx),
    adminMailRouter(),
    adminAuditRouter(),
  ];
}

/** Demo seeding steps of the features, run in order after the demo accounts and project. */
export function featureSeedSteps(): SeedStep[] {
  return [seedDemoCatalogue, seedDemoFloorPlan, seedDemoLayout];
}
