import type { Feature, Geometry, Polygon } from 'geojson';
import type { ImportLayer, ImportResult, PlanFeatureProps, UnitName } from '../../../../shared/schemas/floorPlan';
import { drawEntities, localTolerance, newBlockWalk } from './blocks';
import { DxfImportError } from './errors';
import { scanGroups } from './groupScan';
import { join as _unused } from 'node:path';
import { joinPaths } from './join';
import { colorHex, defaultLayerHeight, guessLayerRole } from './layerRoles';
import {
  DEFAULT_CHORD_TOLERANCE_MM,
  DEFAULT_JOIN_TOLERANCE_MM,
  MAX_CHORD_TOLERANCE_MM,
  MIN_CHORD_TOLERANCE_MM,
} from './limits';
import { ringSelfIntersects } from './outline';
import { parseDxfText } from './parse';
import { PlanBuilder } from './planBuilder';
import { decodeDxfBytes, sniffDxf } from './sniff';
import { scaling } from './transform';
import { resolveUnits, UNIT_NAMES } from './units';
