/**
 * Field labels looked up and the one formatter that turns a zod issue into a sentence naming the
 * field by its label and unit ("Stop time (category 0) must be greater than 0 s"); the labels are in
 * labelTable.ts. The server's error answers, the forms and the analysis' findings all word field
 * problems through `issueSentence`, so no property name or dotted path reaches a person. Imports no
 * zod: issues are read by their shape.
 */
import { FIELD_TABLE, ITEM_TABLE, type FieldLabel, type FieldUnit } from './labelTable';

export type { FieldLabel, FieldUnit };

type Segment = string | number;

interface CompiledRow {
  parts: string[];
  label: string;
  unit?: FieldUnit;
}

const ROWS: CompiledRow[] = FIELD_TABLE.map(([pattern, label, unit]) => ({ parts: pattern.split('.'), label, unit })).sort(
  (a, b) => b.parts.length - a.parts.length,
);

const isIndex = (s: Segment) => typeof s === 'number' || /^\d+$/.test(s);

/** The list positions (from 1) a pattern's `#` took, or null when it does not match the path's end. */
function matchEnd(parts: string[], path: Segment[]): number[] | null {
  if (parts.length > path.length) return null;
  const offset = path.length - parts.length;
  const taken: number[] = [];
  for (let i = 0; i < parts.length; i++) {
    const seg = path[offset + i];
    if (parts[i] === '#') {
      if (!isIndex(seg)) return null;
      taken.push(Number(seg) + 1);
    } else if (String(seg) !== parts[i]) return null;
  }
  return taken;
}

const fill = (label: string, taken: number[]) => label.replace(/\{(\d)\}/g, (_m, d: string) => String(taken[Number(d) - 1] ?? ''));

/** Words of a property name nobody put in the table: "hazardHeightMm" → "Hazard height" (mm). */
function wordsOf(key: string): FieldLabel {
  const units: Array<[RegExp, FieldUnit]> = [
    [/MmS$/, 'mm/s'],
    [/Mm$/, 'mm'],
    [/Deg$/, '°'],
    [/Kg$/, 'kg'],
    [/S$/, 's'],
  ];
  let unit: FieldUnit | undefined;
  let base = key;
  for (const [re, u] of units) {
    if (re.test(base) && base.replace(re, '').length > 0) {
      base = base.replace(re, '');
      unit = u;
      break;
    }
  }
  const words = base
    .replace(/[_-]+/g, ' ')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .trim();
  return { label: words ? words[0].toUpperCase() + words.slice(1) : 'This field', unit };
}

const segmentsOf = (path: ReadonlyArray<PropertyKey>): Segment[] => path.map((p) => (typeof p === 'number' ? p : String(p)));

/** The value at a path of an input (undefined where it has none). */
function valueAt(input: unknown, path: Segment[]): unknown {
  let v = input;
  for (const seg of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<string, unknown>)[String(seg)];
  }
  return v;
}

interface Subject {
  /** The field's label ("Mount height"), null for the whole input. */
  field: FieldLabel | null;
  /** The list item the field belongs to ("arm R2"), when it is in one. */
  item: string | null;
}

/** The field and the list item an issue path names. `input` (the value parsed) lets items go by their ids. */
function subjectOf(rawPath: ReadonlyArray<PropertyKey>, input?: unknown): Subject {
  const path = segmentsOf(rawPath);
  if (!path.length) return { field: null, item: null };
  let field: FieldLabel | null = null;
  for (const row of ROWS) {
    const taken = matchEnd(row.parts, path);
    if (taken) {
      field = { label: fill(row.label, taken), unit: row.unit };
      break;
    }
  }
  const endsAtItem = path.length >= 2 && isIndex(path[path.length - 1]) && ITEM_TABLE.some(([name]) => name === String(path[path.length - 2]));
  if (!field && !endsAtItem) {
    // Nothing in the table names this field: say it in words rather than show the property name.
    const last = [...path].reverse().find((s) => !isIndex(s));
    field = last === undefined ? null : wordsOf(String(last));
  }
  let item: string | null = null;
  for (let i = path.length - 1; i >= 1; i--) {
    if (!isIndex(path[i])) continue;
    const list = ITEM_TABLE.find(([name]) => name === String(path[i - 1]));
    if (!list) continue;
    const value = input === undefined ? undefined : valueAt(input, path.slice(0, i + 1));
    item = list[1](value && typeof value === 'object' ? (value as Record<string, unknown>) : null, Number(path[i]) + 1);
    break;
  }
  return { field, item };
}

/** The label (and unit) people see for a field path, e.g. `params.axes.0.max` → "J1 max" (°); null for the whole input. */
export function fieldLabel(path: ReadonlyArray<PropertyKey>): FieldLabel | null {
  const s = subjectOf(path);
  if (s.field) return s.field;
  return s.item ? { label: upperFirst(s.item) } : null;
}

/** True when the label table names the field at a path (else its label is made from the property's words). */
export function hasTableLabel(path: ReadonlyArray<PropertyKey>): boolean {
  const segs = segmentsOf(path);
  return ROWS.some((row) => matchEnd(row.parts, segs) !== null);
}

/** The shape of a zod 4 issue this formatter reads (zod's `$ZodIssue`, read structurally). */
export interface IssueLike {
  readonly code?: string;
  readonly path: ReadonlyArray<PropertyKey>;
  readonly message: string;
  readonly expected?: string;
  readonly origin?: string;
  readonly minimum?: number | bigint;
  readonly maximum?: number | bigint;
  readonly inclusive?: boolean;
  readonly exact?: boolean;
  readonly values?: ReadonlyArray<unknown>;
  readonly options?: ReadonlyArray<unknown>;
  readonly keys?: ReadonlyArray<string>;
  readonly format?: string;
  readonly divisor?: number | bigint;
  readonly errors?: ReadonlyArray<ReadonlyArray<IssueLike>>;
  readonly params?: Readonly<Record<string, unknown>>;
}

/**
 * A custom issue can ask for the comparison sentence instead of writing it, so that list items
 * get their own labels: `ctx.addIssue({code:'custom', path:['max'], params: greaterThan('min'), message})`.
 */
export const greaterThan = (sibling: string) => ({ greaterThan: sibling });

/** zod's own English messages (no message given by the schema): these are replaced by a sentence. */
const ZOD_DEFAULT = /^(Invalid\b|Too (big|small):|Unrecognized keys?:)/;

const upperFirst = (s: string) => (s ? s[0].toUpperCase() + s.slice(1) : s);
/** Lower-cases a sentence's first word when it is an ordinary word ("Give …" → "give …"; "J1 …", "ISO …" stay). */
export const lowerFirst = (s: string) => (/^(A|[A-Z][a-z]+)\b/.test(s) ? s[0].toLowerCase() + s.slice(1) : s);

/** A number with its unit, as messages write it: "0 s", "100000 mm", "720°". */
export function withUnit(n: number | bigint, unit?: FieldUnit): string {
  const text = typeof n === 'number' && n < 0 ? `−${String(-n)}` : String(n);
  if (!unit) return text;
  return unit === '°' ? `${text}°` : `${text} ${unit}`;
}

/** "a, b or c" (values as people read them: text as it is, numbers with a minus sign). */
function orList(values: ReadonlyArray<unknown>): string {
  const words = values.map((v) => (typeof v === 'number' ? withUnit(v) : String(v)));
  return words.length <= 1 ? (words[0] ?? '') : `${words.slice(0, -1).join(', ')} or ${words[words.length - 1]}`;
}

/** The values a failed union of literals would take ("1 or −1"), from its branches' issues. */
function unionValues(issue: IssueLike): unknown[] | null {
  if (issue.options?.length) return [...issue.options];
  const out: unknown[] = [];
  for (const branch of issue.errors ?? []) {
    if (branch.length !== 1 || branch[0].code !== 'invalid_value' || !branch[0].values) return null;
    out.push(...branch[0].values);
  }
  return out.length ? out : null;
}

/** The sentence of an issue zod worded itself, with the field's label as its subject. */
function composed(issue: IssueLike, subject: string, unit: FieldUnit | undefined): string {
  const min = issue.minimum ?? 0;
  const max = issue.maximum ?? 0;
  const sized = issue.origin === 'string' || issue.origin === 'array' || issue.origin === 'set';
  const things = issue.origin === 'string' ? 'characters' : 'entries';
  switch (issue.code) {
    case 'invalid_type': {
      if (/received undefined$/.test(issue.message)) return `${subject} is required`;
      const expected = issue.expected ?? '';
      if (expected === 'number') return `${subject} must be a number`;
      if (expected === 'int') return `${subject} must be a whole number`;
      if (expected === 'string') return `${subject} must be text`;
      if (expected === 'boolean') return `${subject} must be yes or no`;
      if (expected === 'array') return `${subject} must be a list`;
      if (expected === 'date') return `${subject} must be a date`;
      return `${subject} is not in the expected form`;
    }
    case 'too_small':
      if (sized) {
        if (issue.exact) return `${subject} must have exactly ${min} ${things}`;
        if (Number(min) === 1) return issue.origin === 'string' ? `${subject} is required` : `${subject} must have at least one entry`;
        return `${subject} must have at least ${min} ${things}`;
      }
      if (issue.inclusive && Number(min) === 0) return `${subject} must not be negative`;
      return `${subject} must be ${issue.inclusive ? 'at least' : 'greater than'} ${withUnit(min, unit)}`;
    case 'too_big':
      if (sized) return issue.exact ? `${subject} must have exactly ${max} ${things}` : `${subject} can have at most ${max} ${things}`;
      return `${subject} must be ${issue.inclusive ? 'at most' : 'less than'} ${withUnit(max, unit)}`;
    case 'invalid_value':
    case 'invalid_union': {
      const values = issue.code === 'invalid_value' ? [...(issue.values ?? [])] : unionValues(issue);
      return values?.length ? `${subject} must be ${values.length > 2 ? 'one of ' : ''}${orList(values)}` : `${subject} is not valid`;
    }
    case 'invalid_format':
      if (issue.format === 'email') return `${subject} must be a valid e-mail address`;
      return `${subject} is not in the expected form`;
    case 'not_multiple_of':
      return `${subject} must be a multiple of ${withUnit(issue.divisor ?? 1, unit)}`;
    case 'unrecognized_keys': {
      const n = issue.keys?.length ?? 1;
      return `${subject} has ${n === 1 ? 'a field' : `${n} fields`} it does not take`;
    }
    default:
      return `${subject} is not valid`;
  }
}

const FILLER = new Set(['a', 'an', 'the', 'of', 'to', 'may']);

/** True when a hand-written message already names the field by a word of its label ("Give the fence its height"). */
function mentions(message: string, label: string): boolean {
  const words = label
    .replace(/\([^)]*\)/g, ' ')
    .toLowerCase()
    .split(/[^\p{L}\p{N}]+/u)
    .filter((w) => w && !FILLER.has(w) && !/^\d+$/.test(w));
  const said = new Set(message.toLowerCase().split(/[^\p{L}\p{N}]+/u));
  return words.length === 0 || words.some((w) => said.has(w));
}

export interface IssueSentenceOptions {
  /** The value that was parsed: list items are then named by their ids ("arm R2" rather than "arm 2"). */
  input?: unknown;
}

/**
 * One zod issue as a sentence for people, naming the field by its label and unit and, inside a
 * list, the item ("Mount height of arm R2 must be a number", "Stop time (category 0) must be
 * greater than 0 s"). Messages the schemas wrote themselves are kept, with the field or item put
 * in front where they do not name it. No trailing full stop.
 */
export function issueSentence(issue: IssueLike, opts: IssueSentenceOptions = {}): string {
  const { field, item } = subjectOf(issue.path, opts.input);
  const fieldText = field?.label ?? null;
  const subject = fieldText && item ? `${fieldText} of ${item}` : (fieldText ?? (item ? upperFirst(item) : 'The request'));
  const sibling = issue.params?.greaterThan;
  if (issue.code === 'custom' && typeof sibling === 'string' && issue.path.length) {
    const other = fieldLabel([...issue.path.slice(0, -1), sibling]);
    return `${subject} must be greater than ${other ? lowerFirst(other.label) : 'the lower value'}`;
  }
  if (ZOD_DEFAULT.test(issue.message) || !issue.message) return composed(issue, subject, field?.unit);
  const message = issue.message.replace(/\.$/, '');
  if (fieldText && !mentions(message, fieldText)) return `${subject}: ${lowerFirst(message)}`;
  if (item) return `${upperFirst(item)}: ${lowerFirst(message)}`;
  return message;
}
