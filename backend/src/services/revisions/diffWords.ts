/**
 * The words of the revision diff: for each element of a snapshot, the readable name and unit of
 * every field it holds (lengths mm, angles degrees, times s), how its title and an added or removed
 * one read. A field missing here is still reported by the diff, as "field ‘path’ a → b"; the
 * diff's test fails on such a field of its fixture, so a new field gets its words here.
 */
import { DEVICE_TEXT } from '@shared/analysis';
import type { DiffElement } from '@shared/schemas/revision';

/** One step of a path inside an element: a member name or an array index. */
export type Seg = string | number;

/** What the words of a field may look at. */
export interface WordsCtx {
  /** The path of the field inside its element. */
  path: readonly Seg[];
  /** The element on each side (undefined where it is absent). */
  before: unknown;
  after: unknown;
  /** Arm model names by id on each side. */
  modelNames: { before: ReadonlyMap<number, string>; after: ReadonlyMap<number, string> };
}

export type Unit = 'mm' | '°' | 's' | 'kg' | 'mm/s' | '';

export interface FieldWords {
  /** The field's name in a change line. */
  label: string | ((c: WordsCtx) => string);
  unit?: Unit | ((c: WordsCtx) => Unit);
  /** How one (present) value is written, for values that are not plain numbers. */
  text?: (v: unknown, side: 'before' | 'after', c: WordsCtx) => string;
  /** The field changes as a whole: this writes the entire change line (the diff does not walk into it). */
  line?: (a: unknown, b: unknown, c: WordsCtx) => string;
  /** The members of an object that `line` reads; any other member is compared on its own. */
  covers?: string[];
  /** The word for an absent value (default "none"). */
  none?: string;
  /** An array of objects matched by this member (e.g. layers by name) instead of by position. */
  keyedBy?: string;
}

export interface ElementWords {
  /** Fields by pattern: the path inside the element, `#` for an array index, `*` for a keyed member. */
  fields: Record<string, FieldWords>;
  /** The element's heading in the diff. */
  title: (item: unknown, id: string | null) => string;
  /** One line describing an element that was added or removed. */
  summary: (item: unknown, status: 'added' | 'removed', c: WordsCtx) => string;
  /** Root fields written together as one line (an arm's or a work point's x and y as a move). */
  combined?: Array<{ fields: string[]; field: string; line: (a: Rec, b: Rec) => string }>;
  /** Root fields that are bookkeeping, not content (ids and versions). */
  skip?: string[];
}

type Rec = Record<string, unknown>;
const rec = (v: unknown): Rec => (typeof v === 'object' && v !== null && !Array.isArray(v) ? (v as Rec) : {});
const numOr = (v: unknown, d = 0) => (typeof v === 'number' ? v : d);

const MINUS = '\u2212';

/** A number with at most `decimals` decimals, trailing zeros dropped and a typographic minus. */
export function numText(v: number, decimals = 1): string {
  let s = v.toFixed(decimals);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  if (/^-0$/.test(s)) s = '0';
  return s.replace('-', MINUS);
}

/** Decimals (≤ 3) that write `v` as it is stored. */
function ownDecimals(v: number): number {
  for (let d = 0; d < 3; d++) if (Math.abs(Number(v.toFixed(d)) - v) < 1e-9) return d;
  return 3;
}

/** Two numbers written with as many decimals as either needs, and at least enough that two different values read differently (up to 6). */
export function numPair(a: number, b: number): [string, string] {
  let d = Math.max(ownDecimals(a), ownDecimals(b));
  while (d < 6 && a !== b && numText(a, d) === numText(b, d)) d++;
  return [numText(a, d), numText(b, d)];
}

const withUnit = (s: string, unit: Unit) => (unit === '' ? s : unit === '°' ? `${s}°` : `${s} ${unit}`);
const quoted = (v: unknown) => (v === '' || v === undefined || v === null ? 'none' : `‘${String(v)}’`);
const plain = (v: unknown) => (typeof v === 'string' ? v : JSON.stringify(v));
const xy = (x: unknown, y: unknown) => `${numText(numOr(x))}, ${numText(numOr(y))}`;

/** "a → b" of two values of a field, "none" for an absent one, the unit once at the end. */
export function pairText(a: unknown, b: unknown, unit: Unit, text?: (v: unknown, side: 'before' | 'after') => string, none = 'none'): string {
  const absent = (v: unknown) => v === undefined || v === null;
  const one = (v: unknown, side: 'before' | 'after', s: string | undefined): string => (absent(v) ? none : text ? text(v, side) : (s ?? plain(v)));
  const [as, bs] = typeof a === 'number' && typeof b === 'number' && !text ? numPair(a, b) : [typeof a === 'number' ? numText(a, ownDecimals(a)) : undefined, typeof b === 'number' ? numText(b, ownDecimals(b)) : undefined];
  const left = one(a, 'before', as);
  const right = one(b, 'after', bs);
  const unitless = text !== undefined || (typeof a !== 'number' && typeof b !== 'number');
  if (unitless || unit === '') return `${left} → ${right}`;
  return absent(b) ? `${withUnit(left, unit)} → ${none}` : `${left} → ${withUnit(right, unit)}`;
}

/** A yaw or turn, wrapped to (−180, 180]. */
const wrapDeg = (d: number) => {
  const w = ((((d % 360) + 540) % 360) - 180);
  return w === -180 ? 180 : w;
};

/** How far a point moved between two plan positions, mm (Euclidean distance). */
function movedLine(a: Rec, b: Rec): string {
  const d = Math.hypot(numOr(b.x) - numOr(a.x), numOr(b.y) - numOr(a.y));
  const dist = d < 0.05 ? 'less than 0.1' : numText(d, d < 10 ? 1 : 0);
  return `moved ${dist} mm (from ${xy(a.x, a.y)} to ${xy(b.x, b.y)} mm)`;
}

const MOVED = { fields: ['x', 'y'], field: 'x,y', line: movedLine };

const J1_RANGE = (v: unknown) => {
  const r = rec(v);
  return `${numText(numOr(r.j1Min), 3)}…${numText(numOr(r.j1Max), 3)}°`;
};

const APPROACH_WORDS: Record<string, string> = { top: 'from above', any: 'any direction' };
const KIND_WORDS: Record<string, string> = { fence: 'Fence', opening: 'Access opening', keepout: 'Keep-out', operator: 'Operator area' };
const ROLE_WORDS: Record<string, string> = { boundary: 'floor outline', wall: 'wall', column: 'column', obstacle: 'obstacle', ignore: 'not used' };
const enumText = (words: Record<string, string>) => (v: unknown) => words[String(v)] ?? String(v);
const kindWord = (kind: unknown) => KIND_WORDS[String(kind)] ?? `Boundary (${String(kind)})`;

const modelName = (v: unknown, side: 'before' | 'after', c: WordsCtx) => {
  const id = Number(v);
  return c.modelNames[side].get(id) ?? c.modelNames[side === 'before' ? 'after' : 'before'].get(id) ?? `arm model ${String(v)}`;
};

/** Points of a fence, an opening or an area: how far they moved, or how their count changed. */
function pointsLine(a: unknown, b: unknown): string {
  const pa = Array.isArray(a) ? (a as unknown[]) : [];
  const pb = Array.isArray(b) ? (b as unknown[]) : [];
  if (pa.length !== pb.length) return `reshaped: ${pa.length} → ${pb.length} points`;
  const shifts = pa.map((p, i) => {
    const [ax, ay] = Array.isArray(p) ? (p as number[]) : [0, 0];
    const [bx, by] = Array.isArray(pb[i]) ? (pb[i] as number[]) : [0, 0];
    return [bx - ax, by - ay] as const;
  });
  const longest = Math.max(...shifts.map(([dx, dy]) => Math.hypot(dx, dy)));
  const dist = longest < 0.05 ? 'less than 0.1' : numText(longest, longest < 10 ? 1 : 0);
  const same = shifts.every(([dx, dy]) => Math.abs(dx - shifts[0][0]) < 1e-9 && Math.abs(dy - shifts[0][1]) < 1e-9);
  return same ? `moved ${dist} mm (all ${pa.length} points)` : `reshaped: points moved up to ${dist} mm`;
}

const heightsText = (v: unknown) => (Array.isArray(v) && v.length ? `${v.map((h) => numText(numOr(h), 3)).join(', ')} mm` : 'none');

const familyOf = (c: WordsCtx) => String(rec(rec(c.after).params).family ?? rec(rec(c.before).params).family ?? '');
const AXIS_NAMES: Record<string, string[]> = { scara: ['J1', 'J2'], articulated: ['J1', 'J2', 'J3'], linkage: ['J1', 'J2 motor', 'J3 motor'] };
const axisName = (c: WordsCtx) => {
  const i = Number(c.path[2]);
  return AXIS_NAMES[familyOf(c)]?.[i] ?? `J${i + 1}`;
};
const jointOf = (c: WordsCtx) => {
  const i = Number(c.path[2]);
  const pick = (m: unknown) => rec((rec(rec(m).params).joints as unknown[] | undefined)?.[i]);
  return { n: i + 1, type: String(pick(c.after).type ?? pick(c.before).type ?? 'revolute') };
};
const jointUnit = (c: WordsCtx): Unit => (jointOf(c).type === 'prismatic' ? 'mm' : '°');
const directionText = (v: unknown) => (v === 1 ? 'normal' : v === -1 ? 'reversed' : String(v));

const axisField = (what: string, unit?: Unit, text?: FieldWords['text']): FieldWords => ({ label: (c) => `${axisName(c)} ${what}`, unit, text });
const jointField = (what: string, unit?: Unit | ((c: WordsCtx) => Unit), text?: FieldWords['text']): FieldWords => ({ label: (c) => `joint ${jointOf(c).n} ${what}`, unit, text });
const mmField = (label: string): FieldWords => ({ label, unit: 'mm' });
const degField = (label: string): FieldWords => ({ label, unit: '°' });

/** Arm model parameters, every family (shared/schemas/armModel.ts). */
const MODEL_FIELDS: Record<string, FieldWords> = {
  name: { label: 'name', text: quoted },
  family: { label: 'kinematic family' },
  'params.family': { label: 'kinematic family' },
  'params.innerLink': mmField('inner link length'),
  'params.outerLink': mmField('outer link length'),
  'params.strokeMin': mmField('stroke lower end'),
  'params.strokeMax': mmField('stroke upper end'),
  'params.shoulderHeight': mmField('shoulder height'),
  'params.shoulderOffset': mmField('shoulder offset'),
  'params.upperArm': mmField('upper arm length'),
  'params.forearm': mmField('forearm length'),
  'params.elbowOffset': mmField('elbow offset'),
  'params.flangeOffset.horizontal': mmField('flange offset, horizontal'),
  'params.flangeOffset.vertical': mmField('flange offset, vertical'),
  'params.fourBar.ground': mmField('four-bar ground link'),
  'params.fourBar.crank': mmField('four-bar crank'),
  'params.fourBar.coupler': mmField('four-bar coupler'),
  'params.fourBar.rocker': mmField('four-bar rocker'),
  'params.fourBar.groundAngle': degField('four-bar ground angle'),
  'params.fourBar.branch': { label: 'four-bar branch' },
  'params.fourBar.rockerToForearm': degField('four-bar rocker-to-forearm angle'),
  'params.interiorAngle.min': degField('interior angle, smallest'),
  'params.interiorAngle.max': degField('interior angle, largest'),
  'params.axes.#.min': axisField('lower limit', '°'),
  'params.axes.#.max': axisField('upper limit', '°'),
  'params.axes.#.zeroOffset': axisField('zero offset', '°'),
  'params.axes.#.direction': axisField('direction', undefined, directionText),
  'params.convention': { label: 'DH convention' },
  'params.joints.#.type': jointField('type'),
  'params.joints.#.a': jointField('DH a', 'mm'),
  'params.joints.#.alpha': jointField('DH α', '°'),
  'params.joints.#.d': jointField('DH d', 'mm'),
  'params.joints.#.theta': jointField('DH θ', '°'),
  'params.joints.#.min': jointField('lower limit', jointUnit),
  'params.joints.#.max': jointField('upper limit', jointUnit),
  'params.joints.#.zeroOffset': jointField('zero offset', jointUnit),
  'params.joints.#.direction': jointField('direction', undefined, directionText),
  'params.tool.x': mmField('tool point x'),
  'params.tool.y': mmField('tool point y'),
  'params.tool.z': mmField('tool point z'),
  'params.toolLength': mmField('tool length'),
  'params.payloadRadius': mmField('payload radius'),
  'params.payloadKg': { label: 'payload', unit: 'kg' },
  'params.stopTimeS': { label: 'stopping time, category 0 stop', unit: 's' },
  'params.stopTimeCat1S': { label: 'stopping time, category 1 stop', unit: 's' },
  'params.stopDistanceMm': mmField('stopping distance'),
  'params.maxSpeedMmS': { label: 'maximum speed', unit: 'mm/s' },
  'params.linkSizes.innerLinkRadius': mmField('link size, inner link radius'),
  'params.linkSizes.outerLinkRadius': mmField('link size, outer link radius'),
  'params.linkSizes.upperArmRadius': mmField('link size, upper arm radius'),
  'params.linkSizes.forearmRadius': mmField('link size, forearm radius'),
  'params.linkSizes.rearLength': mmField('link size, rear link length'),
  'params.linkSizes.rearRadius': mmField('link size, rear link radius'),
  'params.linkSizes.linkRadius': mmField('link size, link radius'),
  'params.linkSizes.toolRadius': mmField('link size, tool radius'),
};

const armTitle = (item: unknown, id: string | null) => {
  const label = rec(item).label;
  return `Arm ${id ?? ''}${label ? ` (${String(label)})` : ''}`;
};

/** The words of every element of a snapshot. */
export const ELEMENT_WORDS: Record<DiffElement, ElementWords> = {
  project: {
    title: () => 'Project',
    skip: ['id'],
    summary: () => 'project details',
    fields: { name: { label: 'name', text: quoted }, clientName: { label: 'client', text: quoted }, siteName: { label: 'site', text: quoted } },
  },
  layout: {
    title: () => 'Cell layout',
    skip: ['id', 'version', 'content'],
    summary: () => 'cell layout',
    fields: { name: { label: 'name', text: quoted } },
  },
  floorPlan: {
    title: () => 'Floor plan',
    summary: (item) => {
      const f = rec(item);
      return `${quoted(f.fileName)} (drawing unit ${String(f.units)}, ${Array.isArray(rec(f.geometry).features) ? (rec(f.geometry).features as unknown[]).length : 0} features)`;
    },
    fields: {
      checksum: { label: 'checksum', text: (v) => String(v).slice(0, 12) },
      id: { label: 'upload no.' },
      fileName: { label: 'file', text: quoted },
      units: { label: 'drawing unit' },
      geometry: {
        label: 'drawing',
        line: (a, b) => {
          const n = (g: unknown) => (Array.isArray(rec(g).features) ? (rec(g).features as unknown[]).length : 0);
          return n(a) === n(b) ? `drawing changed (${n(b)} features)` : `drawing changed: ${n(a)} → ${n(b)} features`;
        },
      },
      bounds: {
        label: 'extent',
        covers: ['minX', 'minY', 'maxX', 'maxY'],
        line: (a, b) => {
          const t = (v: unknown) => {
            const r = rec(v);
            return `x ${numText(numOr(r.minX))}…${numText(numOr(r.maxX))}, y ${numText(numOr(r.minY))}…${numText(numOr(r.maxY))}`;
          };
          return `extent ${t(a)} → ${t(b)} mm`;
        },
      },
      layers: { label: 'layer', keyedBy: 'name', text: (v) => `${ROLE_WORDS[String(rec(v).role)] ?? String(rec(v).role)}, ${numOr(rec(v).entityCount)} entities` },
      'layers.*.name': { label: (c) => `layer ${String(c.path[1])} name`, text: quoted },
      'layers.*.role': { label: (c) => `layer ${String(c.path[1])} role`, text: enumText(ROLE_WORDS) },
      'layers.*.height': { label: (c) => `layer ${String(c.path[1])} height`, unit: 'mm', none: 'full height' },
      'layers.*.entityCount': { label: (c) => `layer ${String(c.path[1])} entities` },
      'layers.*.color': { label: (c) => `layer ${String(c.path[1])} colour` },
    },
  },
  workHeights: {
    title: () => 'Work heights',
    summary: (item) => heightsText(item),
    fields: { '': { label: 'work heights', line: (a, b) => `${heightsText(a)} → ${heightsText(b)}` } },
  },
  arm: {
    title: armTitle,
    combined: [MOVED],
    summary: (item, _s, c) => {
      const a = rec(item);
      const restrict = a.restrict ? `, J1 restriction ${J1_RANGE(a.restrict)}` : '';
      return `at ${xy(a.x, a.y)} mm, yaw ${numText(numOr(a.yaw))}°, mount height ${numText(numOr(a.mountHeight))} mm, model ${modelName(a.armModelId, 'after', c)}${restrict}`;
    },
    fields: {
      armModelId: { label: 'model', text: modelName },
      label: { label: 'label', text: quoted },
      yaw: {
        label: 'yaw',
        line: (a, b) => {
          const turn = wrapDeg(numOr(b) - numOr(a));
          const [as, bs] = numPair(numOr(a), numOr(b));
          return `turned ${turn > 0 ? '+' : ''}${numText(turn, 1)}° (yaw ${as} → ${bs}°)`;
        },
      },
      mountHeight: mmField('mount height'),
      restrict: { label: 'J1 restriction', covers: ['j1Min', 'j1Max'], line: (a, b) => `J1 restriction ${a ? J1_RANGE(a) : 'none'} → ${b ? J1_RANGE(b) : 'none (full J1 range)'}` },
    },
  },
  armModel: {
    title: (item) => String(rec(item).name ?? 'Arm model'),
    summary: (item, status) => `${status === 'added' ? 'now used on the layout' : 'no longer used on the layout'} (${String(rec(item).family)} family)`,
    fields: MODEL_FIELDS,
  },
  boundary: {
    title: (item, id) => {
      const z = rec(item);
      return `${kindWord(z.kind)} ${id ?? ''}${z.label ? ` (${String(z.label)})` : ''}`;
    },
    summary: (item) => {
      const z = rec(item);
      const n = Array.isArray(z.points) ? z.points.length : 0;
      if (z.kind === 'fence') return `height ${numText(numOr(z.height))} mm, ${n} points${z.meshMm !== undefined ? `, mesh ${numText(numOr(z.meshMm))} mm ${String(z.meshShape)}` : ''}`;
      if (z.kind === 'opening') return `in fence ${String(z.fenceId)}, ${z.safeguard ? `safeguard ${enumText(DEVICE_TEXT)(rec(z.safeguard).device)}` : 'no safeguard'}`;
      return `${n} corners`;
    },
    fields: {
      kind: { label: 'kind', text: (v) => kindWord(v).toLowerCase() },
      label: { label: 'label', text: quoted },
      points: { label: 'points', line: pointsLine },
      height: mmField('height'),
      fenceId: { label: 'in fence' },
      meshMm: mmField('mesh size'),
      meshShape: { label: 'mesh shape' },
      'safeguard.device': { label: 'safeguard', text: enumText(DEVICE_TEXT) },
      'safeguard.responseTimeS': { label: 'safeguard response time', unit: 's' },
      'safeguard.stopCategory': { label: 'stop category the safeguard triggers' },
      'safeguard.resolutionMm': mmField('light-curtain resolution'),
      'safeguard.beams': { label: 'beams' },
      'safeguard.approach': { label: 'approach to the detection boundary' },
      'safeguard.heightMm': mmField('detection boundary height'),
    },
  },
  workPoint: {
    title: (_item, id) => `Work point ${id ?? ''}`,
    combined: [MOVED],
    summary: (item) => {
      const p = rec(item);
      const arm = p.assignedArm ? `, assigned arm ${String(p.assignedArm)}` : '';
      const tag = p.tag ? `, tag ${quoted(p.tag)}` : '';
      return `at ${xy(p.x, p.y)} mm, z ${numText(numOr(p.z))} mm, approach ${enumText(APPROACH_WORDS)(p.approach)}${arm}${tag}`;
    },
    fields: {
      z: mmField('z'),
      approach: { label: 'approach', text: enumText(APPROACH_WORDS) },
      tag: { label: 'tag', text: quoted },
      assignedArm: { label: 'assigned arm' },
    },
  },
  other: { title: () => 'Other', summary: () => 'other content', fields: {} },
};

/** The pattern of a path: array indices become `#`, members of a keyed list `*`. */
export function fieldPattern(path: readonly Seg[], keyedAt: ReadonlySet<number> = new Set()): string {
  return path.map((s, i) => (typeof s === 'number' ? '#' : keyedAt.has(i) ? '*' : s)).join('.');
}

/** The words of a field of an element, or undefined when the table has none (the diff then writes the raw path). */
export function wordsFor(element: DiffElement, pattern: string): FieldWords | undefined {
  return Object.prototype.hasOwnProperty.call(ELEMENT_WORDS[element].fields, pattern) ? ELEMENT_WORDS[element].fields[pattern] : undefined;
}
