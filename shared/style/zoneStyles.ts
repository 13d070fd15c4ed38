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
const SHARED_RED: Rgb = [196, 40, 40];
const FENCE_BLACK: Rgb = [20, 20, 20];
const FENCE_SCREEN = 'var(--color-zone-fence, #1c2230)';

/** The style of every kind of mark. */
export const ZONE_STYLES = {
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
    legend: 'Reach band',
    // Still different: a solid line on screen, a dotted one on paper.
    screen: { colour: REACH, width: 2, widthEmphasis: 2.5 },
    paper: { colour: 'arm', legendColour: PAPER_INK, width: 0.18, dash: [0.4, 0.6] },
    dxf: { layer: 'RF_BAND', aci: ACI.green, lineType: 'CONTINUOUS' },
  },
  shared: {
    legend: 'Shared zone (two arms overlap)',
    // Still different: purple on screen, red on paper.
    screen: { colour: 'var(--color-shared-zone)', width: 1.5, widthEmphasis: 3, hatch: { spacingPx: 7, width: 1.4 } },
    paper: { colour: SHARED_RED, width: 0.3, hatch: { spacing: 1.4, legendSpacing: 1.2, angles: [45], width: 0.15 } },
    dxf: { layer: 'RF_SHARED', aci: ACI.red, lineType: 'CONTINUOUS' },
  },
  fence: {
    legend: 'Guard fence (h = height, mm)',
    // Still different: ink-blue #1c2230 on screen, near-black on paper.
    screen: { colour: FENCE_SCREEN, width: 4.5, label: { colour: FENCE_SCREEN, weight: 400 } },
    paper: { colour: FENCE_BLACK, width: 0.7, label: FENCE_BLACK },
    dxf: { layer: 'RF_FENCES', aci: ACI.white, lineType: 'CONTINUOUS' },
  },
  opening: {
    legend: 'Access opening',
    // A gap over the fence line with a bar (screen) or jamb (paper) across each end in `colour`, `width`.
    // Still different: the end bars are teal on screen, the jambs fence-black on paper.
    screen: {
      colour: 'var(--color-zone-opening, #0b6e69)',
      width: 3,
      gap: { colour: 'var(--color-paper-raised, #fff)', width: 7 },
      label: { colour: FENCE_SCREEN, weight: 400 },
    },
    paper: { colour: FENCE_BLACK, width: 0.35, gap: { colour: [255, 255, 255], width: 1.1, centreWidth: 0.15, centreDash: [0.8, 0.6] }, label: FENCE_BLACK },
    dxf: { layer: 'RF_ZONES', aci: ACI.yellow, lineType: 'CONTINUOUS' },
  },
  operator: {
    legend: 'Operator area',
    screen: {
      colour: 'var(--color-zone-operator, #c27c0e)',
      width: 1.5,
      widthEmphasis: 2.5,
      dash: '7 3',
      fill: 'var(--color-zone-operator, #c27c0e)',
      fillOpacity: 0.16,
      label: { colour: 'var(--color-zone-operator, #c27c0e)', weight: 700 },
    },
    // Still different: amber #c27c0e with a dash on screen, darker amber with a dash-dot on paper.
    paper: { colour: [150, 110, 10], width: 0.3, dash: [2.4, 0.8, 0.4, 0.8], fill: { colour: [214, 160, 20], opacity: 0.18 }, label: [120, 86, 6] },
    dxf: { layer: 'RF_ZONES', aci: ACI.yellow, lineType: 'CONTINUOUS' },
  },
  keepout: {
    legend: 'Keep-out',
    // Still different: slate #5f6472 single-hatched on screen, grey cross-hatched on paper.
    screen: {
      colour: 'var(--color-zone-keepout, #5f6472)',
      width: 1.5,
      widthEmphasis: 2.5,
      hatch: { spacingPx: 9, width: 1 },
      label: { colour: 'var(--color-zone-keepout, #5f6472)', weight: 400 },
    },
    paper: { colour: [110, 110, 110], width: 0.35, hatch: { spacing: 2.2, legendSpacing: 1.2, angles: [45, -45], width: 0.1 }, label: [70, 70, 70] },
    dxf: { layer: 'RF_ZONES', aci: ACI.yellow, lineType: 'CONTINUOUS' },
  },
  pointReached: {
    legend: 'Work point (red = no arm reaches it)',
    screen: { colour: 'var(--color-ink)', width: 1.3 },
    paper: { colour: PAPER_INK, width: 0.2 },
    dxf: { layer: 'RF_POINTS', aci: ACI.magenta, lineType: 'CONTINUOUS' },
  },
  pointUnreached: {
    legend: 'Work point (red = no arm reaches it)',
    // Still different: the critical-finding red on screen, the shared-zone red on paper.
    screen: { colour: 'var(--color-finding-critical)', width: 2 },
    paper: { colour: SHARED_RED, width: 0.2 },
    dxf: { layer: 'RF_POINTS', aci: ACI.magenta, lineType: 'CONTINUOUS' },
  },
} as const satisfies Readonly<Record<MarkKind, MarkStyle>>;
