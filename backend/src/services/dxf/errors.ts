/**
 * Why a DXF file could not be imported. Each code is an expected outcome of reading a file a
 * planner uploaded, never a crash.
 */
export type DxfImportErrorCode =
  | 'not-dxf'
  | 'binary-dxf'
  | 'parse-error'
  | 'empty'
  | 'no-entities'
  | 'bad-coordinates'
  /** The drawing expands to more geometry than one import may hold. */
  | 'too-complex'
  /** Reading took longer than the time allowed (worker wrapper only). */
  | 'timeout'
  /** The reading worker stopped for a reason of its own (worker wrapper only). */
  | 'internal';

export const DXF_IMPORT_ERROR_CODES: readonly DxfImportErrorCode[] = [
  'not-dxf',
  'binary-dxf',
  'parse-error',
  'empty',
  'no-entities',
  'bad-coordinates',
  'too-complex',
  'timeout',
  'internal',
];

/**
 * A file that cannot be imported. `message` is plain English written for the planner and may be
 * shown as it is (`userFacing` is always true); `line` is the 1-based line of the file where the
 * problem was found, when it is known.
 */
export class DxfImportError extends Error {
  readonly code: DxfImportErrorCode;
  readonly line?: number;
  readonly userFacing = true as const;

  constructor(code: DxfImportErrorCode, message: string, line?: number) {
    super(message);
    this.name = 'DxfImportError';
    this.code = code;
    if (line !== undefined) this.line = line;
  }

  /** Plain-object form, for JSON answers and for crossing a worker boundary. */
  toJSON(): { code: DxfImportErrorCode; message: string; line?: number } {
    return this.line === undefined
      ? { code: this.code, message: this.message }
      : { code: this.code, message: this.message, line: this.line };
  }
}

/** True when `value` is a DxfImportError (also across module copies). */
export function isDxfImportError(value: unknown): value is DxfImportError {
  return value instanceof DxfImportError || (value instanceof Error && value.name === 'DxfImportError');
}
