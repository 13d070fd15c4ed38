/**
 * The label table: what people call each field of the input schemas in this folder, with its unit,
 * and how list items are named in messages. `labels.ts` reads it (`fieldLabel`, `issueSentence`);
 * a new schema field gets its row here.
 */

/** A unit as it is written after a number: "mm" with a space, "°" without. */
export type FieldUnit = 'mm' | '°' | 's' | 'kg' | 'mm/s';

export interface FieldLabel {
  label: string;
  unit?: FieldUnit;
}

/**
 * Field path patterns (dot-joined; `#` stands for a list index) → label and unit. A pattern matches
 * the end of an issue's path, the longest match wins, so `fourBar.ground` labels both
 * `params.fourBar.ground` (arm model form) and `fourBar.ground` (the parameters alone). In labels,
 * `{1}`, `{2}` … are the pattern's list positions counted from 1.
 */
export const FIELD_TABLE: ReadonlyArray<readonly [string, string, FieldUnit?]> = [
  // Arm models: name, family and the parameters of every family (shared/schemas/armModel.ts).
  ['name', 'Name'],
  ['params', 'Arm parameters'],
  ['family', 'Kinematic family'],
  ['innerLink', 'Inner link', 'mm'],
  ['outerLink', 'Outer link', 'mm'],
  ['strokeMin', 'Stroke bottom', 'mm'],
  ['strokeMax', 'Stroke top', 'mm'],
  ['shoulderHeight', 'Shoulder height', 'mm'],
  ['shoulderOffset', 'Shoulder offset', 'mm'],
  ['upperArm', 'Upper arm', 'mm'],
  ['forearm', 'Forearm', 'mm'],
  ['elbowOffset', 'Elbow offset', 'mm'],
  ['axes', 'Axes'],
  ['axes.#', 'J{1}'],
  ['axes.#.min', 'J{1} min', '°'],
  ['axes.#.max', 'J{1} max', '°'],
  ['axes.#.zeroOffset', 'J{1} zero offset', '°'],
  ['axes.#.direction', 'J{1} direction'],
  ['linkSizes', 'Link sizes'],
  ['linkSizes.innerLinkRadius', 'Inner link radius', 'mm'],
  ['linkSizes.outerLinkRadius', 'Outer link radius', 'mm'],
  ['linkSizes.toolRadius', 'Tool radius', 'mm'],
  ['linkSizes.upperArmRadius', 'Upper arm radius', 'mm'],
  ['linkSizes.forearmRadius', 'Forearm radius', 'mm'],
  ['linkSizes.rearLength', 'Rear length', 'mm'],
  ['linkSizes.rearRadius', 'Rear radius', 'mm'],
  ['linkSizes.linkRadius', 'Link radius', 'mm'],
  ['flangeOffset', 'Flange offset'],
  ['flangeOffset.horizontal', 'Flange offset out', 'mm'],
  ['flangeOffset.vertical', 'Flange offset up', 'mm'],
  ['fourBar', 'Four-bar'],
  ['fourBar.ground', 'Ground link', 'mm'],
  ['fourBar.crank', 'Crank', 'mm'],
  ['fourBar.coupler', 'Coupler', 'mm'],
  ['fourBar.rocker', 'Rocker', 'mm'],
  ['fourBar.groundAngle', 'Ground angle', '°'],
  ['fourBar.branch', 'Four-bar branch'],
  ['fourBar.rockerToForearm', 'Rocker to forearm', '°'],
  ['interiorAngle', 'Elbow angle'],
  ['interiorAngle.min', 'Elbow angle min', '°'],
  ['interiorAngle.max', 'Elbow angle max', '°'],
  ['convention', 'DH convention'],
  ['joints', 'Joints'],
  ['joints.#', 'J{1}'],
  ['joints.#.type', 'J{1} type'],
  ['joints.#.a', 'J{1} a', 'mm'],
  ['joints.#.alpha', 'J{1} alpha', '°'],
  ['joints.#.d', 'J{1} d', 'mm'],
  ['joints.#.theta', 'J{1} theta', '°'],
  // Limits of a DH joint are degrees or millimetres by its type: the messages give the unit.
  ['joints.#.min', 'J{1} min'],
  ['joints.#.max', 'J{1} max'],
  ['joints.#.zeroOffset', 'J{1} zero offset'],
  ['joints.#.direction', 'J{1} direction'],
  ['tool', 'Tool point'],
  ['tool.x', 'Tool x', 'mm'],
  ['tool.y', 'Tool y', 'mm'],
  ['tool.z', 'Tool z', 'mm'],
  ['toolLength', 'Tool length', 'mm'],
  ['payloadRadius', 'Payload radius', 'mm'],
  ['payloadKg', 'Payload', 'kg'],
  ['stopTimeS', 'Stop time (category 0)', 's'],
  ['stopTimeCat1S', 'Stop time (category 1)', 's'],
  ['stopDistanceMm', 'Stop distance', 'mm'],
  ['maxSpeedMmS', 'Max tool speed', 'mm/s'],
  // Kinematics requests: a model by id or by its parameters, joint values, heights.
  ['model', 'Arm model'],
  ['model.id', 'Arm model'],
  ['heights', 'Heights'],
  ['heights.#', 'Height {1}', 'mm'],

  // Cell layouts: arms, work points, boundaries, work heights (shared/schemas/layout.ts).
  ['version', 'Version'],
  ['floorPlanId', 'Floor plan'],
  ['content', 'Layout content'],
  ['arms', 'Arms'],
  ['id', 'Id'],
  ['armModelId', 'Arm model'],
  ['label', 'Label'],
  ['x', 'x (east)', 'mm'],
  ['y', 'y (north)', 'mm'],
  ['z', 'z (height)', 'mm'],
  ['yaw', 'Yaw', '°'],
  ['mountHeight', 'Mount height', 'mm'],
  ['restrict', 'J1 limits'],
  ['restrict.j1Min', 'J1 min', '°'],
  ['restrict.j1Max', 'J1 max', '°'],
  ['workPoints', 'Work points'],
  ['approach', 'Approach'],
  ['tag', 'Tag'],
  ['assignedArm', 'Assigned arm'],
  ['boundaries', 'Boundaries'],
  ['kind', 'Boundary kind'],
  ['points', 'Points'],
  ['points.#', 'Point {1}'],
  ['points.#.0', 'Point {1} x', 'mm'],
  ['points.#.1', 'Point {1} y', 'mm'],
  ['boundaries.#.height', 'Fence height', 'mm'],
  ['fenceId', 'Fence'],
  ['safeguard', 'Safeguard'],
  ['device', 'Safeguard device'],
  ['responseTimeS', 'Response time', 's'],
  ['stopCategory', 'Stop category'],
  ['resolutionMm', 'Resolution', 'mm'],
  ['beams', 'Beams'],
  ['heightMm', 'Detection height', 'mm'],
  ['boundaries.#.meshMm', 'Mesh size', 'mm'],
  ['meshShape', 'Mesh shape'],
  ['workHeights', 'Work heights'],
  ['workHeights.#', 'Work height {1}', 'mm'],

  // Projects, members, users, invitations, sign-in (project.ts, user.ts; the invitation routes).
  ['clientName', 'Client'],
  ['siteName', 'Site'],
  ['description', 'Description'],
  ['userId', 'User'],
  ['email', 'E-mail'],
  ['password', 'Password'],
  ['role', 'Role'],
  ['active', 'Active'],
  ['projectId', 'Project'],

  // Floor plans: layer roles and heights, the drawing unit (floorPlan.ts).
  ['layers', 'Layers'],
  ['layers.#.name', 'Layer name'],
  ['layers.#.role', 'Layer role'],
  ['height', 'Height', 'mm'],
  ['units', 'Drawing unit'],
  ['file', 'Drawing file'],

  // Guard ring proposal: the fence system (fenceProposal.ts).
  ['panelWidthsMm', 'Panel widths', 'mm'],
  ['panelWidthsMm.#', 'Panel width {1}', 'mm'],
  ['panelHeightMm', 'Panel height', 'mm'],
  ['meshMm', 'Mesh opening', 'mm'],
  ['postWidthMm', 'Post width', 'mm'],
  ['clearanceMm', 'Clearance', 'mm'],
  ['doorWidthsMm', 'Door widths', 'mm'],
  ['doorWidthsMm.#', 'Door width {1}', 'mm'],
  ['useWalls', 'Use of walls'],

  // Placement search and auto-layout (placement.ts).
  ['armId', 'Arm'],
  ['pointIds', 'Work points'],
  ['pointIds.#', 'Work point {1}'],
  ['minMarginMm', 'Min margin', 'mm'],
  ['yawMinDeg', 'Yaw from', '°'],
  ['yawMaxDeg', 'Yaw to', '°'],
  ['yawStepDeg', 'Yaw step', '°'],
  ['mountHeightMm', 'Mount height', 'mm'],
  ['gridMm', 'Grid', 'mm'],
  ['models', 'Arm models'],
  ['models.#.count', 'Count'],
  ['seed', 'Seed'],
  ['timeLimitS', 'Time limit', 's'],

  // Reviews: comments and decisions; the safeguarding calculators; the audit filter (their routes).
  ['body', 'Comment'],
  ['findingId', 'Finding'],
  ['point', 'Spot on the plan'],
  ['point.x', 'x (east)', 'mm'],
  ['point.y', 'y (north)', 'mm'],
  ['resolved', 'Resolved'],
  ['decision', 'Decision'],
  ['comment', 'Comment'],
  ['hazardHeightMm', 'Hazard height', 'mm'],
  ['structureHeightMm', 'Guard height', 'mm'],
  ['openingMm', 'Opening size', 'mm'],
  ['shape', 'Opening shape'],
  ['action', 'Action'],
  ['actor', 'Actor'],
  ['entity', 'Item kind'],
  ['entityId', 'Item'],
  ['from', 'From'],
  ['to', 'To'],
  ['page', 'Page'],
  ['pageSize', 'Page size'],
];

/** Words for the boundary kinds of a layout, as item names in messages. */
const BOUNDARY_WORD: Record<string, string> = { fence: 'fence', opening: 'access opening', keepout: 'keep-out', operator: 'operator area' };

/**
 * Lists whose items are named in messages ("arm R2", "fence F1", "layer Walls"): the item's own id
 * (or name) when the input is at hand, else its position counted from 1.
 */
export const ITEM_TABLE: ReadonlyArray<readonly [string, (item: Record<string, unknown> | null, n: number) => string]> = [
  ['arms', (it, n) => `arm ${typeof it?.id === 'string' && it.id ? it.id : n}`],
  ['workPoints', (it, n) => `work point ${typeof it?.id === 'string' && it.id ? it.id : n}`],
  ['boundaries', (it, n) => `${BOUNDARY_WORD[String(it?.kind)] ?? 'boundary'} ${typeof it?.id === 'string' && it.id ? it.id : n}`],
  ['layers', (it, n) => (typeof it?.name === 'string' && it.name ? `layer “${it.name}”` : `layer ${n}`)],
  ['models', (_it, n) => `arm model ${n} of the list`],
];
