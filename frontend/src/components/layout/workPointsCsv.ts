import Papa from 'papaparse';
import { WorkPoint } from '@shared/schemas/layout';
import { issueSentence } from '@shared/schemas/labels';
import type { AnalysisResult } from '@shared/analysis';

/** The columns a work-point CSV file carries, in the order export writes them. */
export const WORK_POINT_COLUMNS = ['id', 'x', 'y', 'z', 'approach', 'tag', 'assignedArm'] as const;
export type WorkPointColumn = (typeof WORK_POINT_COLUMNS)[number];
const REQUIRED: ReadonlyArray<WorkPointColumn> = ['id', 'x', 'y', 'z'];
const NUMERIC = new Set<WorkPointColumn>(['x', 'y', 'z']);
const DELIMITERS = [',', ';', '\t'] as const;
/** Export prefixes margin columns with this, one per arm ("margin R1 (mm)"). */
export const MARGIN_COLUMN_PREFIX = 'margin ';
/** The header cells export writes: each column with its unit or its values (import reads both forms). */
export const WORK_POINT_HEADERS: Record<WorkPointColumn, string> = {
  id: 'id',
  x: 'x (mm)',
  y: 'y (mm)',
  z: 'z (mm above floor)',
  approach: 'approach (top/any)',
  tag: 'tag',
  assignedArm: 'assignedArm',
};
/** Lines starting with this before the header row are notes (what, when, cautions), not data. */
export const NOTE_PREFIX = '#';

/** One problem with one row; `row` counts records as a spreadsheet does (the header is row 1). */
export interface CsvRowError {
  row: number;
  message: string;
}

export interface ParsedWorkPoint {
  row: number;
  point: WorkPoint;
}

export interface WorkPointsCsvResult {
  /** Rows that passed every check, in file order. */
  points: ParsedWorkPoint[];
  /** One entry per problem, in row order; a row with an error is not in `points`. */
  errors: CsvRowError[];
  /** Things worth knowing that do not stop the import (ignored columns, blank rows). */
  notes: string[];
  delimiter: string;
  /** Data rows read (blank rows not counted). */
  rowCount: number;
}

export interface WorkPointsCsvOptions {
  /** Arms of the layout; when given, an assigned arm must be one of them. */
  armIds?: ReadonlyArray<string>;
}

const NUMBER_RE = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const DECIMAL_COMMA_RE = /^[+-]?\d+,\d+$/;
// Export escapes text a spreadsheet would run as a formula with a leading apostrophe; undo that.
const ESCAPED_FORMULA_RE = /^'(?=[=+\-@\t\r])/;

/**
 * Lower-cases a header cell, drops a unit in brackets at its end and spaces, `_` and `-`, so
 * "Assigned arm" matches assignedArm and "x (mm)" matches x.
 */
function headerKey(cell: string): string {
  return cell.trim().replace(/\s*\([^()]*\)\s*$/, '').toLowerCase().replace(/[\s_-]+/g, '');
}

function isNoteLine(line: string): boolean {
  return line.trim().replace(/^"/, '').startsWith(NOTE_PREFIX);
}
const COLUMN_BY_KEY = new Map<string, WorkPointColumn>(WORK_POINT_COLUMNS.map((c) => [headerKey(c), c]));

/** The delimiter of the header line: whichever of `,` `;` tab occurs most outside quotes (`,` on a tie). */
export function detectDelimiter(text: string): string {
  const firstLine = text.split(/\r\n|\n|\r/).find((l) => l.trim() !== '' && !isNoteLine(l)) ?? '';
  const unquoted = firstLine.replace(/"[^"]*"/g, '');
  let best: string = ',';
  let bestCount = 0;
  for (const d of DELIMITERS) {
    const n = unquoted.split(d).length - 1;
    if (n > bestCount) {
      best = d;
      bestCount = n;
    }
  }
  return best;
}

/**
 * A number cell as a number, or null when it is not one. With `;` as the delimiter a decimal
 * comma ("12,5") is read as a decimal point, as spreadsheets in comma-decimal locales write it
 * (common practice).
 */
export function parseNumberCell(raw: string, decimalComma = false): number | null {
  const s = raw.trim();
  if (NUMBER_RE.test(s)) {
    const n = Number(s);
    return Number.isFinite(n) ? n : null;
  }
  if (decimalComma && DECIMAL_COMMA_RE.test(s)) return Number(s.replace(',', '.'));
  return null;
}

function cleanText(raw: string): string {
  return raw.trim().replace(ESCAPED_FORMULA_RE, '');
}

function isBlank(record: string[]): boolean {
  return record.every((c) => c.trim() === '');
}

/**
 * Reads a work-point CSV (header row required; columns id, x, y, z [mm, plan frame], approach,
 * tag, assignedArm in any order; `,` `;` or tab; UTF-8 BOM allowed) and checks every row with the
 * WorkPoint schema, duplicate ids and the layout's arms. Never throws on bad content: problems are
 * values in `errors`, each with its row number.
 */
export function parseWorkPointsCsv(text: string, options: WorkPointsCsvOptions = {}): WorkPointsCsvResult {
  if (typeof text !== 'string') throw new Error('text must be a string');
  const body = text.replace(/^\uFEFF/, '');
  const delimiter = detectDelimiter(body);
  const result: WorkPointsCsvResult = { points: [], errors: [], notes: [], delimiter, rowCount: 0 };
  const parsed = Papa.parse<string[]>(body, { delimiter, header: false, skipEmptyLines: false, dynamicTyping: false });
  const records = parsed.data;
  const badRecords = new Map<number, string>();
  for (const e of parsed.errors) {
    // Papa reports record indices; a stray quote is worth telling, a short last line is handled below.
    if (e.type === 'Quotes' && typeof e.row === 'number') badRecords.set(e.row, e.message.replace(/\.$/, '').toLowerCase());
  }

  // Note lines (what, when, cautions) may come before the header row; they are not data.
  const headerIndex = records.findIndex((r) => !isBlank(r) && !(r[0] ?? '').trim().startsWith(NOTE_PREFIX));
  if (headerIndex < 0) {
    result.errors.push({ row: 1, message: 'the file is empty: the first row must name the columns (id, x, y, z …)' });
    return result;
  }
  const header = records[headerIndex];
  const headerRow = headerIndex + 1;
  const columnAt: Array<WorkPointColumn | null> = [];
  const seen = new Map<WorkPointColumn, number>();
  const ignored: string[] = [];
  const margins: string[] = [];
  header.forEach((cell, i) => {
    const col = COLUMN_BY_KEY.get(headerKey(cell)) ?? null;
    columnAt.push(col);
    if (col) {
      if (seen.has(col)) result.errors.push({ row: headerRow, message: `column ${col} appears twice (columns ${seen.get(col)! + 1} and ${i + 1})` });
      else seen.set(col, i);
    } else if (cell.trim().toLowerCase().startsWith(MARGIN_COLUMN_PREFIX.trim())) {
      margins.push(cell.trim());
    } else if (cell.trim() !== '') {
      ignored.push(cell.trim());
    }
  });
  const missing = REQUIRED.filter((c) => !seen.has(c));
  if (missing.length === REQUIRED.length) {
    result.errors.push({ row: headerRow, message: `the first row must name the columns (id, x, y, z …); found "${header.join(delimiter)}"` });
    return result;
  }
  if (missing.length) {
    result.errors.push({ row: headerRow, message: `missing column${missing.length > 1 ? 's' : ''} ${missing.join(', ')}` });
    return result;
  }
  if (result.errors.length) return result;
  if (ignored.length) result.notes.push(`Ignored column${ignored.length > 1 ? 's' : ''} not used for work points: ${ignored.map((c) => `"${c}"`).join(', ')}.`);
  if (margins.length) result.notes.push(`Margin columns (${margins.length}) are not read: the analysis works margins out again.`);

  const armIds = options.armIds ? new Set(options.armIds) : null;
  const firstRowOfId = new Map<string, number>();
  let blank = 0;
  const decimalComma = delimiter === ';';
  for (let r = headerIndex + 1; r < records.length; r++) {
    const record = records[r];
    const row = r + 1;
    if (isBlank(record)) {
      // Papa yields one empty record for the file's final line break; do not count that one.
      if (r < records.length - 1) blank++;
      continue;
    }
    result.rowCount++;
    const problems: string[] = [];
    if (badRecords.has(r)) problems.push(badRecords.get(r)!);
    const extra = record.slice(header.length).filter((c) => c.trim() !== '');
    if (extra.length) problems.push(`has ${record.length} values but the header names ${header.length} columns`);
    const cell = (c: WorkPointColumn): string | undefined => {
      const i = seen.get(c);
      return i === undefined ? undefined : (record[i] ?? '');
    };
    const draft: Record<string, unknown> = {};
    for (const c of WORK_POINT_COLUMNS) {
      const raw = cell(c);
      if (raw === undefined) continue;
      if (NUMERIC.has(c)) {
        if (raw.trim() === '') {
          problems.push(`${c} is missing`);
          continue;
        }
        const n = parseNumberCell(raw, decimalComma);
        if (n === null) problems.push(`${c} is not a number ("${raw.trim()}")`);
        else draft[c] = n;
      } else if (c === 'approach') {
        const a = raw.trim().toLowerCase();
        if (a === '') continue; // schema default: top
        if (a !== 'top' && a !== 'any') problems.push(`approach must be top or any, not "${raw.trim()}"`);
        else draft.approach = a;
      } else if (c === 'assignedArm') {
        const a = cleanText(raw);
        if (a !== '') draft.assignedArm = a;
      } else {
        const t = cleanText(raw);
        if (c === 'id' && t === '') problems.push('id is missing');
        else draft[c] = t;
      }
    }
    if (typeof draft.id === 'string' && draft.id !== '') {
      const first = firstRowOfId.get(draft.id);
      if (first !== undefined) problems.push(`duplicate id ${draft.id} (first on row ${first})`);
      else firstRowOfId.set(draft.id, row);
    }
    if (armIds && typeof draft.assignedArm === 'string' && !armIds.has(draft.assignedArm)) {
      problems.push(`assigned arm ${draft.assignedArm} is not on this cell layout`);
    }
    const checked = WorkPoint.safeParse(draft);
    if (!checked.success) {
      for (const issue of checked.error.issues) {
        const field = String(issue.path[0] ?? '');
        // A missing or unreadable cell has already been reported above.
        if ((NUMERIC.has(field as WorkPointColumn) || field === 'id') && !(field in draft)) continue;
        problems.push(issueSentence(issue));
      }
    }
    if (problems.length) for (const message of problems) result.errors.push({ row, message });
    else if (checked.success) result.points.push({ row, point: checked.data });
  }
  if (blank) result.notes.push(`Skipped ${blank} blank row${blank > 1 ? 's' : ''}.`);
  if (result.rowCount === 0) result.notes.push('The file has a header but no work points.');
  return result;
}

/** How an import meets the layout's points: replace them all, or add new ids and update known ones. */
export type ImportMode = 'replace' | 'merge';

export interface MergeResult {
  points: WorkPoint[];
  added: number;
  updated: number;
  removed: number;
}

/**
 * The layout's work points after an import. `replace` keeps only the incoming points; `merge`
 * keeps the existing order, replaces points whose id comes in again, and appends new ids.
 */
export function mergeWorkPoints(existing: ReadonlyArray<WorkPoint>, incoming: ReadonlyArray<WorkPoint>, mode: ImportMode): MergeResult {
  if (mode !== 'replace' && mode !== 'merge') throw new Error('mode must be replace or merge');
  if (mode === 'replace') {
    const incomingIds = new Set(incoming.map((p) => p.id));
    const kept = existing.filter((p) => incomingIds.has(p.id)).length;
    return { points: [...incoming], added: incoming.length - kept, updated: kept, removed: existing.length - kept };
  }
  const byId = new Map(incoming.map((p) => [p.id, p]));
  let updated = 0;
  const points = existing.map((p) => {
    const next = byId.get(p.id);
    if (!next) return p;
    byId.delete(p.id);
    updated++;
    return next;
  });
  const added = [...byId.values()];
  return { points: [...points, ...added], added: added.length, updated, removed: 0 };
}

/**
 * Work points as CSV text: `notes` as `# ` lines (one quoted cell each), then the import columns
 * with their units, then one `margin <arm id> (mm)` column per arm (positive = reached; blank when
 * not analysed). Text that a spreadsheet would run as a formula is prefixed with an apostrophe;
 * import strips it again and skips the note lines.
 */
export function workPointsToCsv(
  points: ReadonlyArray<WorkPoint>,
  armIds: ReadonlyArray<string>,
  coverage: AnalysisResult['coverage'] | null,
  notes: ReadonlyArray<string> = [],
): string {
  const fields = [...WORK_POINT_COLUMNS.map((c) => WORK_POINT_HEADERS[c]), ...armIds.map((a) => `${MARGIN_COLUMN_PREFIX}${a} (mm)`)];
  const data = points.map((p) => {
    const row = coverage?.[p.id];
    return [
      p.id,
      p.x,
      p.y,
      p.z,
      p.approach,
      p.tag,
      p.assignedArm ?? '',
      ...armIds.map((a) => (row && typeof row[a] === 'number' ? row[a] : '')),
    ];
  });
  return csvNoteLines(notes) + Papa.unparse({ fields, data }, { escapeFormulae: true, newline: '\r\n' });
}

/** Notes as CSV comment lines: `# ` and the text, one quoted cell per line (quotes doubled, RFC 4180). */
export function csvNoteLines(notes: ReadonlyArray<string>): string {
  return notes.map((n) => `"${NOTE_PREFIX} ${n.replace(/"/g, '""')}"\r\n`).join('');
}
