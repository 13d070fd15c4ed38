import type { Router } from 'express';
import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import { seedDemoCatalogue } from './db/demoCatalogue';
import { seedDemoFloorPlan } from './db/demoFloorPlan';
import { seedDemoLayout } from './db/demoLayout';
import type { SeedStep } from './db/seed';
import { armModelsRouter } from './routes/armModels';
import { floorPlansRouter } from './routes/floorPlans';
import { kinematicsRouter } from './routes/kinematics';
import { layoutsRouter } from './routes/layouts';

export interface FeatureContext {
  config: Config;
  sequelize: Sequelize;
}

/** API routers of the product's features, mounted under /api after the foundation routes. */
export function featureRouters(ctx: FeatureContext): Router[] {
  return [
    floorPlansRouter(ctx.sequelize, { uploadLimitBytes: ctx.config.uploadLimitBytes }),
    layoutsRouter(ctx.sequelize),
    armModelsRouter(ctx.sequelize),
    kinematicsRouter(),
  ];
}

/** Demo seeding steps of the features, run in order after the demo accounts and project. */
export function featureSeedSteps(): SeedStep[] {
  return [seedDemoCatalogue, seedDemoFloorPlan, seedDemoLayout];
}
