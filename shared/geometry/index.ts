export {
  armPoint,
  type ArmPoint,
  type Degrees,
  type Millimetres,
  planPoint,
  type PlanPoint,
  type Polygon2,
  type Pt,
  type Radians,
  type Ring,
} from './types';
export {
  assertFinite,
  assertPositive,
  DEFAULT_CHORD_TOLERANCE_MM,
  EPS_DEG,
  EPS_MM,
  GRID_MM,
  isClose,
} from './tolerance';
export { angularMargin, normalizeDeg, normalizeDeg360, normalizeRad, toDegrees, toRadians } from './angles';
export { polygonArea, polygonsArea, ringArea } from './area';
export {
  addToBounds,
  type Bounds,
  emptyBounds,
  isEmptyBounds,
  padBounds,
  pointsBounds,
  polygonsBounds,
} from './bounds';
export { armPose, type ArmPose, type PosePlacement } from './frames';
export {
  nearestPointOnSegment,
  nearestSegmentParam,
  nearestSegmentParamRel,
  pointSegmentDistance,
  pointSegmentDistance2Rel,
} from './segmentDistance';
export { appendArc, arcPoints, type ArcSide, circleRing, innerArcStep, outerArcStep } from './arc';
export { annularSector, type AnnularSectorSpec, sectorArea } from './annularSector';
export {
  distanceToBoundary,
  pointInPolygon,
  pointInPolygons,
  pointInRing,
  signedDistanceToPolygons,
} from './pointInPolygon';
export { snapPolygons, snapRing, snapValue } from './snap';
export {
  type AreaGeometry,
  geoJSONToPolygons,
  mapPolygons,
  polygonsToGeoJSON,
  positionsToRing,
  ringToPositions,
} from './geojson';
export { clipDifference, clipIntersect, clipIntersectShapes, clipOffset, clipShape, clipUnion, type ClipShape } from './clipper';
export { buildDistanceGrid, type DistanceGrid } from './distanceGrid';
export { simplifyPolygons, simplifyPolygonsOutward, simplifyRing } from './simplify';
export { checkDrawingUnit, lengthText, PLAUSIBLE_EXTENT_MM, type UnitCheck } from './drawingScale';
export { convexHull, ringPerimeter } from './hull';
