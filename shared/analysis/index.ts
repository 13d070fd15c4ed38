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
  type Severity,
  type SharedZone,
  type StructureItem,
} from './types';
export { type FloorLayer, prepareFloor } from './floor';
export { type Analyzer, createAnalyzer, FAR_MM, FENCE_CLEARANCE_MM, MIN_FENCE_HEIGHT_MM } from './analyze';
export { findingId, m2, m2Text, mm, parseFindingId, SEVERITY_OF, sortFindings } from './messages';
export { isReached, roundMargin, shortfallText } from './reached';
export {
  cellReasonText,
  type PlacementCandidate,
  type PlacementMap,
  type PlacementNames,
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
