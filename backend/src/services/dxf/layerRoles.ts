import { DEFAULT_ROLE_HEIGHT, type LayerRole } from '@shared/schemas/floorPlan';

export { DEFAULT_ROLE_HEIGHT };

/** Whole words (tokens of the layer name) that mark a role; checked in the order of the table. */
const TOKEN_RULES: ReadonlyArray<[LayerRole, RegExp]> = [
  ['ignore', /^(TEXT|TXT|TEXTS|DIM|DIMS|DIMENSION|DIMENSIONS|ANNO|ANNOT|ANNOTATION|HATCH|HATCHES|HATCHING|DEFPOINTS|NOTE|NOTES|LABEL|LABELS|TITLE|BORDER|FRAME|GRID|AXIS|AXES|VIEWPORT|VPORT|SYMBOL|SYMBOLS|FURN|FURNITURE|DOOR|DOORS|WINDOW|WINDOWS)\d*$/],
  ['boundary', /^(OUTLINE|OUTLINES|BOUNDARY|BOUNDARIES|BOUNDS|FLOOR|FLOORS|PERIMETER|PERIM|ENVELOPE|FOOTPRINT|HALL)\d*$/],
  ['wall', /^(WALL|WALLS|PARTITION|PARTITIONS)\d*$/],
  ['column', /^(COL|COLS|COLUMN|COLUMNS|PILLAR|PILLARS|PIER|PIERS|POST|POSTS|STANCHION|STANCHIONS)\d*$/],
  ['obstacle', /^(MACH|MACHINE|MACHINES|MACHINERY|EQUIP|EQUIPMENT|EQPT|OBST|OBSTACLE|OBSTACLES|OBSTRUCTION|RACK|RACKS|RACKING|CONVEYOR|CONVEYORS|PLANT)\d*$/],
];

/** Parts of words that mark a role when no whole word did (e.g. "PARTITIONWALL", "MACHINERY2"). */
const PART_RULES: ReadonlyArray<[LayerRole, RegExp]> = [
  ['ignore', /TEXT|DIM|ANNO|HATCH|DEFPOINT/],
  ['boundary', /OUTLINE|BOUNDAR|FLOOR|PERIM/],
  ['wall', /WALL|PARTITION/],
  ['column', /COLUMN|PILLAR/],
  ['obstacle', /MACH|EQUIP|OBST/],
];

/**
 * Guesses what a layer stands for from its name (common practice in CAD layer naming):
 * OUTLINE/BOUNDARY/FLOOR → boundary, WALL → wall, COL/COLUMN/PILLAR → column,
 * MACH/EQUIP/OBST → obstacle, TEXT/DIM/ANNO/HATCH/DEFPOINTS → ignore. Annotation words win, so
 * "WALL-HATCH" is ignored. A name that says nothing is taken as an obstacle: drawn geometry an
 * arm might hit is kept in the checks until the planner says otherwise.
 */
export function guessLayerRole(name: string): LayerRole {
  const upper = name.toUpperCase();
  const tokens = upper.split(/[^A-Z0-9]+/).filter(Boolean);
  for (const [role, re] of TOKEN_RULES) if (tokens.some((t) => re.test(t))) return role;
  for (const [role, re] of PART_RULES) if (re.test(upper)) return role;
  return 'obstacle';
}

/** Default height of a role, mm above the floor (null = full height): walls and columns full height, obstacles 1500 mm. */
export function defaultLayerHeight(role: LayerRole): number | null {
  return DEFAULT_ROLE_HEIGHT[role];
}

/** `#rrggbb` of a 24-bit colour number; white (ACI 7 on a dark screen) when unknown. */
export function colorHex(color: unknown): string {
  if (typeof color !== 'number' || !Number.isInteger(color) || color < 0 || color > 0xffffff) return '#ffffff';
  return `#${color.toString(16).padStart(6, '0')}`;
}
