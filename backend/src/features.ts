import type { Router } from 'express';
import { seedDemoCatalogue } from './db/demoCatalogue';
import { seedDemoFloorPlan } from './db/demoFloorPlan';
import { seedDemoLayout } from './db/demoLayout';
import { seedDemoReview } from './db/demoReview';
import type { SeedStep } from './db/seed';
import type { FeatureContext } from './featureContext';
import { adminAuditRouter } from './routes/adminAudit';
import { adminMailRouter } from './routes/adminMail';
import { armModelsRouter } from './routes/armModels';
import { commentsRouter } from './routes/comments';
import { fenceProposalsRouter } from './routes/fenceProposals';
import { floorPlansRouter } from './routes/floorPlans';
import { invitationsRouter } from './routes/invitations';
import { kinematicsRouter } from './routes/kinematics';
import { layoutsRouter } from './routes/layouts';
import { placementRouter } from './routes/placement';
import { planSheetsRouter } from './routes/planSheets';
import { revisionsRouter } from './routes/revisions';
import { safeguardingRouter } from './routes/safeguarding';
import { setAnalysisCap } from './services/layoutAnalysis';
import { configureHeavyWork, heavyWorkSettings } from './services/workerPool';

/** API routers of the product's features, mounted under /api after the foundation routes. */
export function featureRouters(ctx: FeatureContext): Router[] {
  configureHeavyWork(heavyWorkSettings(ctx.config));
  setAnalysisCap(ctx.config.analysisMaxChecks);
  return [
    floorPlansRouter(ctx.sequelize, { uploadLimitBytes: ctx.config.uploadLimitBytes, importConcurrency: ctx.config.dxfImportConcurrency }),
    layoutsRouter(ctx.sequelize),
    armModelsRouter(ctx.sequelize),
    kinematicsRouter(),
    safeguardingRouter(),
    fenceProposalsRouter(),
    placementRouter(),
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
  return [seedDemoCatalogue, seedDemoFloorPlan, seedDemoLayout, seedDemoReview];
}
