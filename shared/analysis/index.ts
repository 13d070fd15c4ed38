export {
  type AnalysisInput,
  type AnalysisResult,
  type ArmEnvelope,
  type ArmReach,
  type ArmReachFactory,
  type Finding,
  FINDING_KINDS,
  type FindingKind,
  type PreparedFloor,
  type SafeguardFenceRow,
  type SafeguardingResult,
  type SafeguardOpeningRow,
  type Severity,
  type SharedZone,
  type StructureItem,
} from './types';
export { type FloorLayer, prepareFloor } from './floor';
export { type Analyzer, createAnalyzer, FAR_MM, FENCE_CLEARANCE_MM, MIN_FENCE_HEIGHT_MM } from './analyze';
export { type CheckedContent, type CheckedFloor, checkedFloorOf, checksRun, noFindingsSentence } from './checks';
export { ConcernLookup, concernsText, type ConcernContent, type ConcernRole, type FindingConcern, findingConcerns } from './concerns';
export { findingId, m2, m2Text, mm, parseFindingId, reasonOf, SEVERITY_OF, sortFindings } from './messages';
export { isReached, roundMargin, shortfallText } from './reached';
export {
  bestAlone,
  cellReasonText,
  type PlacementCandidate,
  type PlacementMap,
  type PlacementNames,
  type PlacementNeighbour,
  type PlacementPoint,
  type PlacementProgress,
  type PlacementQuery,
  type PlacementResult,
  placementSearch,
  placementSteps,
  type PointLimit,
  REASON,
  yawList,
} from './placement';
export {
  autoLayout,
  type AutoLayoutArm,
  type AutoLayoutModel,
  type AutoLayoutProgress,
  type AutoLayoutQuery,
  type AutoLayoutResult,
  autoLayoutSteps,
  layoutScore,
  proposalContent,
} from './autoLayout';
export { armReachFor, armReachFromModels, MISSING_MODEL_TEXT, placedMaxSpace } from './armReach';
export {
  ANCHORS_PER_POST,
  bomCsv,
  type BomLine,
  CORNER_DEG,
  doorItem,
  type FenceLine,
  fenceLinesOf,
  fenceParts,
  type FenceParts,
  MIN_CUT_PANEL_MM,
  type PlacedDoor,
  type PlacedPanel,
  type PlacedPost,
  type PostKind,
  type RunPanel,
  SINGLE_LEAF_MAX_MM,
  splitRun,
  WALL_TOUCH_MM,
} from './fenceBom';
export {
  applyFenceProposal,
  DOOR_INTERLOCK_RESPONSE_S,
  type FenceProposal,
  FenceProposalError,
  type FenceProposalInput,
  type ProposedRing,
  proposeFence,
  type RequiredDistance,
} from './fenceProposal';
export {
  type Box,
  boxOverlap,
  boxUnion,
  obstacleBoxes,
  perimeter,
  routeAroundObstacles,
  snapToWalls,
  splitOnWalls,
  WALL_SNAP_MM,
  wallFacesOf,
} from './fenceRing';
export { placementQueryOf, presentPlacement } from './placementRequest';
export {
  checkSectionLine,
  type SectionArm,
  type SectionCut,
  sectionCutOf,
  type SectionDimension,
  type SectionFence,
  type SectionInput,
  type SectionLine,
  sectionOf,
  type SectionOpening,
  type SectionResult,
  type SectionStructure,
} from './section';
export {
  type ArmSafeguardMeasure,
  DEVICE_TEXT,
  FENCE_SAFEGUARD_RANGE_MM,
  fenceSolidParts,
  measureArmSafeguarding,
  type SafeguardArm,
  safeguardingChecks,
} from './safeguarding';
