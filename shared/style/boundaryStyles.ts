/**
 * How each kind of mark on a layout is drawn: on screen (the editor; CSS colours, theme tokens with
 * a fallback, screen px), on paper (the plan sheet; sRGB 0–255, paper mm) and in the DXF export
 * (layer name, AutoCAD Color Index, line type). One table, read by the editor's drawing, the plan
 * sheet's drawing and legend, and the DXF writer, so a style is changed in one place. Pure data.
 */

/** sRGB, 0–255 per channel. */
export type Rgb = readonly [number, number, number];

/** Ink of the plan sheet (text, frames, reached work points), sRGB. */
export const PAPER_INK: Rgb = [28, 34, 48];

/** Colour numbers of the AutoCAD Color Index that the DXF export uses. */
export const ACI = { red: 1, yellow: 2, green: 3, cyan: 4, blue: 5, magenta: 6, white: 7 } as const;

export type MarkKind =
  | 'armBase'
  | 'maxSpace'
  | 'restricted'
  | 'band'
  | 'shared'
  | 'fence'
  | 'opening'
  | 'operator'
  | 'keepout'
  | 'pointReached'
  | 'pointUnreached';

export interface ScreenLook {
  /** Line colour (CSS). */
  colour: string;
  /** Line width, screen px; `widthEmphasis` when the mark is selected or highlighted. */
  width: number;
  widthEmphasis?: number;
  strokeOpacity?: number;
  /** SVG dash array, screen px. */
  dash?: string;
  /** Solid fill (CSS colour) and its opacity; `fillOpacityEmphasis` when highlighted. */
  fill?: string;
  fillOpacity?: number;
  fillOpacityEmphasis?: number;
  /** Hatch fill: lines at 45°, `spacingPx` apart and `width` px wide at any zoom, in `colour`. */
  hatch?: { spacingPx: number; width: number };
  /** Label colour (CSS) and font weight. */
  label?: { colour: string; weight: number };
  /** An opening's gap, drawn over the fence line. */
  gap?: { colour: string; width: number };
}

export interface PaperLook {
  /** Line colour; 'arm' = the arm's own colour of the sheet's per-arm palette. */
  colour: Rgb | 'arm';
  /** Legend swatch colour where the drawing's colour varies per arm (absent: the first arm's colour). */
  legendColour?: Rgb;
  /** Line width, paper mm. */
  width: number;
  /** Dash pattern, paper mm (absent: solid). */
  dash?: readonly number[];
  /** Solid fill and its opacity (absent colour: the line colour). */
  fill?: { colour?: Rgb; opacity: number };
  /** Hatch: line spacing on the plan and in the legend swatch, paper mm; angles, degrees on paper. */
  hatch?: { spacing: number; legendSpacing: number; angles: readonly number[]; width: number };
  /** Label colour. */
  label?: Rgb;
  /** An opening's gap, drawn over the fence line, and the dashed line along it. */
  gap?: { colour: Rgb; width: number; centreWidth: number; centreDash: readonly number[] };
}

export interface DxfLook {
  /** Layer name (reach bands: the prefix, one layer per work height). */
  layer: string;
  aci: number;
  lineType: 'CONTINUOUS' | 'DASHED';
}

export interface MarkStyle {
  /** Wording of the plan sheet's legend row. */
  legend: string;
  screen: ScreenLook;
  paper: PaperLook;
  dxf: DxfLook;
}

const REACH = 'var(--color-reach)';
/** Shared zones: the same purple on screen (--color-shared-zone, #8e5cc4) and on paper. */
const SHARED_PURPLE: Rgb = [142, 92, 196];
/** Work points no arm reaches: the critical-finding red (--color-finding-critical, #b42318), used for nothing else on paper. */
const NOT_REACHED_RED: Rgb = [180, 35, 24];
/** Fences: the ink colour #1c2230 on screen and on paper. */
const FENCE_INK: Rgb = PAPER_INK;
const FENCE_SCREEN = 'var(--color-boundary-fence, #1c2230)';

/** The style of every kind of mark. */
export const BOUNDARY_STYLES = {
  armBase: {
    legend: 'Arm base (tick = yaw 0 of J1)',
    // Still different: one reach colour on screen, a colour per arm on paper.
    screen: { colour: REACH, width: 2, widthEmphasis: 3 },
    paper: { colour: 'arm', width: 0.35 },
    dxf: { layer: 'RF_ARMS', aci: ACI.blue, lineType: 'CONTINUOUS' },
  },
  maxSpace: {
    legend: 'Maximum space (all J1 limits)',
    // Still different: one reach colour on screen, a colour per arm on paper.
    screen: { colour: REACH, width: 1, strokeOpacity: 0.75, dash: '6 4' },
    paper: { colour: 'arm', legendColour: PAPER_INK, width: 0.25, dash: [1.6, 1] },
    dxf: { layer: 'RF_MAX_SPACE', aci: ACI.cyan, lineType: 'DASHED' },
  },
  restricted: {
    legend: 'Restricted space (restricting limits)',
    // Still different: one reach colour on screen, a colour per arm on paper.
    screen: { colour: REACH, width: 1, strokeOpacity: 0.45, fill: REACH, fillOpacity: 0.1, fillOpacityEmphasis: 0.17 },
    paper: { colour: 'arm', width: 0.3, fill: { opacity: 0.1 } },
    dxf: { layer: 'RF_RESTRICTED', aci: ACI.blue, lineType: 'CONTINUOUS' },
  },
  band: {
    legend: 'Reach band (at a work height)',
    // A short dash everywhere: on screen, on paper and in the DXF.
    screen: { colour: REACH, width: 2, widthEmphasis: 2.5, dash: '5 3' },
    paper: { colour: 'arm', legendColour: PAPER_INK, width: 0.18, dash: [1, 0.6] },
    dxf: { layer: 'RF_BAND', aci: ACI.green, lineType: 'DASHED' },
  },
  shared: {
    legend: 'Shared zone (two arms overlap)',
    screen: { colour: 'var(--color-shared-zone)', width: 1.5, widthEmphasis: 3, hatch: { spacingPx: 7, width: 1.4 } },
    paper: { colour: SHARED_PURPLE, width: 0.3, hatch: { spacing: 1.4, legendSpacing: 1.2, angles: [45], width: 0.15 } },
    dxf: { layer: 'RF_SHARED', aci: ACI.magenta, lineType: 'CONTINUOUS' },
  },
  fence: {
    legend: 'Guard fence (h = height, mm)',
    screen: { colour: FENCE_SCREEN, width: 4.5, label: { colour: FENCE_SCREEN, weight: 400 } },
    paper: { colour: FENCE_INK, width: 0.7, label: FENCE_INK },
    dxf: { layer: 'RF_FENCES', aci: ACI.white, lineType: 'CONTINUOUS' },
  },
  opening: {
    legend: 'Access opening',
    // A gap over the fence line with a teal bar across each end, on screen and on paper.
    screen: {
      colour: 'var(--color-boundary-opening, #0b6e69)',
      width: 3,
      gap: { colour: 'var(--color-paper-raised, #fff)', width: 7 },
      label: { colour: FENCE_SCREEN, weight: 400 },
    },
    paper: { colour: [11, 110, 105], width: 0.35, gap: { colour: [255, 255, 255], width: 1.1, centreWidth: 0.15, centreDash: [0.8, 0.6] }, label: FENCE_INK },
    dxf: { layer: 'RF_BOUNDARIES', aci: ACI.yellow, lineType: 'CONTINUOUS' },
  },
  operator: {
    legend: 'Operator area',
    screen: {
      colour: 'var(--color-boundary-operator, #c27c0e)',
      width: 1.5,
      widthEmphasis: 2.5,
      dash: '7 3',
      fill: 'var(--color-boundary-operator, #c27c0e)',
      fillOpacity: 0.16,
      label: { colour: 'var(--color-boundary-operator, #c27c0e)', weight: 700 },
    },
    // Amber #c27c0e, dashed, lightly filled: on screen and on paper.
    paper: { colour: [194, 124, 14], width: 0.3, dash: [2.4, 1], fill: { colour: [194, 124, 14], opacity: 0.16 }, label: [150, 96, 10] },
    dxf: { layer: 'RF_BOUNDARIES', aci: ACI.yellow, lineType: 'CONTINUOUS' },
  },
  keepout: {
    legend: 'Keep-out',
    // Slate #5f6472, single-hatched at 45°: on screen and on paper.
    screen: {
      colour: 'var(--color-boundary-keepout, #5f6472)',
      width: 1.5,
      widthEmphasis: 2.5,
      hatch: { spacingPx: 9, width: 1 },
      label: { colour: 'var(--color-boundary-keepout, #5f6472)', weight: 400 },
    },
    paper: { colour: [95, 100, 114], width: 0.35, hatch: { spacing: 1.8, legendSpacing: 1.2, angles: [45], width: 0.12 }, label: [70, 74, 84] },
    dxf: { layer: 'RF_BOUNDARIES', aci: ACI.yellow, lineType: 'CONTINUOUS' },
  },
  pointReached: {
    legend: 'Work point (red = not reached)',
    screen: { colour: 'var(--color-ink)', width: 1.3 },
    paper: { colour: PAPER_INK, width: 0.2 },
    dxf: { layer: 'RF_POINTS', aci: ACI.magenta, lineType: 'CONTINUOUS' },
  },
  pointUnreached: {
    legend: 'Work point (red = not reached)',
    screen: { colour: 'var(--color-finding-critical)', width: 2 },
    paper: { colour: NOT_REACHED_RED, width: 0.2 },
    dxf: { layer: 'RF_POINTS', aci: ACI.magenta, lineType: 'CONTINUOUS' },
  },
} as const satisfies Readonly<Record<MarkKind, MarkStyle>>;
