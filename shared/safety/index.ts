export {
  SAFEGUARD_DEVICES,
  SafeguardInputError,
  recommendedBeamHeights,
  separationDistance,
  type Approach,
  type SafeguardDevice,
  type Separation,
  type SeparationInput,
} from './separation';
export {
  CRUSHING_GAP_BODY_MM,
  MESH_SHAPES,
  NotCoveredError,
  OUT_OF_REACH_UPWARD_MM,
  REACH_OVER_COLUMNS_MM,
  REACH_OVER_MIN_STRUCTURE_MM,
  REACH_OVER_ROWS,
  REACH_THROUGH_ROWS,
  reachOverDistance,
  reachThroughDistance,
  type MeshShape,
  type ReachOver,
} from './reachDistances';
export { CAUTION_TEXT, CAUTIONS, exportNotes, exportStamp } from './cautions';
