import type { ComponentType } from 'react';
import type { ProjectDetailDto } from '@shared/schemas/project';
import type { Action } from '@shared/policy';
import { FloorPlanSection } from '../components/floorPlan/FloorPlanSection';
import { LayoutsSection } from '../components/layout/LayoutsSection';
import { ProjectDetails } from '../components/project/ProjectDetails';
import { ProjectMembers } from '../components/project/ProjectMembers';
import { RevisionsSection } from '../components/review/RevisionsSection';

/** One section of the project page: its anchor id, heading and content. */
export interface ProjectSection {
  id: string;
  title: string;
  /** A line under the heading saying what the section is for. */
  lead?: string;
  /** Shown only to roles that may do this (shared/policy.ts); everyone when omitted. */
  requires?: Action;
  Component: ComponentType<{ project: ProjectDetailDto }>;
}

/**
 * The sections of the project page, in display order.
 *
 * EXTENSION POINT — "Floor plans" (requires 'floorPlan.read') and "Layouts" (requires
 * 'layout.read') are added here, between "Details" and "Members", each as a component under
 * `src/components/project/` that receives the loaded project.
 */
export const PROJECT_SECTIONS: ProjectSection[] = [
  { id: 'details', title: 'Details', Component: ProjectDetails },
  {
    id: 'floor-plans',
    title: 'Floor plans',
    lead: 'The building drawing (DXF) the cell layouts are placed on, with what each of its layers stands for.',
    requires: 'floorPlan.read',
    Component: FloorPlanSection,
  },
  {
    id: 'layouts',
    title: 'Cell layouts',
    lead: 'Working copies that place arms, work points and boundaries on a floor plan, with their findings.',
    requires: 'layout.read',
    Component: LayoutsSection,
  },
  {
    id: 'revisions',
    title: 'Revisions',
    lead: 'Frozen snapshots of cell layouts sent for sign-off, and the plan sheets released to the client.',
    requires: 'revision.read',
    Component: RevisionsSection,
  },
  {
    id: 'members',
    title: 'Members',
    lead: 'People who work on this project. Clients see a project only when they are a member of it.',
    Component: ProjectMembers,
  },
];
