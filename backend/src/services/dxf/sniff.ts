import { DxfImportError } from './errors';

/** First bytes of a binary DXF file (DXF reference, "Binary DXF Files"). */
export const BINARY_DXF_SENTINEL = 'AutoCAD Binary DXF';

const BINARY_MESSAGE =
  'This is a binary DXF file, which cannot be read here. Save the drawing again as an ASCII DXF file and upload that.';
const NOT_DXF_MESSAGE =
  'This file is not a DXF drawing. Export the floor plan from your CAD program as an ASCII DXF file.';

/**
 * Turns uploaded bytes into text: UTF-8 (DXF since 2007), else Windows-1252 (the usual code page
 * of older files). A binary DXF is refused here, before any decoding.
 */
export function decodeDxfBytes(bytes: Uint8Array): string {
  if (bytes.length >= BINARY_DXF_SENTINEL.length) {
    let head = '';
    for (let i = 0; i < BINARY_DXF_SENTINEL.length; i++) head += String.fromCharCode(bytes[i]);
    if (head === BINARY_DXF_SENTINEL) throw new DxfImportError('binary-dxf', BINARY_MESSAGE);
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return new TextDecoder('windows-1252').decode(bytes);
  }
}

/**
 * Checks that `text` looks like an ASCII DXF file and returns it with the byte-order mark removed
 * and every line ending turned into "\n" (the parser splits on CR, LF and CRLF alike, so the
 * lines are the same). Throws DxfImportError 'empty', 'binary-dxf' or 'not-dxf'.
 */
export function sniffDxf(text: string): string {
  let t = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (t.trim().length === 0) {
    throw new DxfImportError('empty', 'The file is empty. Upload the floor plan as an ASCII DXF file.');
  }
  if (t.startsWith(BINARY_DXF_SENTINEL)) throw new DxfImportError('binary-dxf', BINARY_MESSAGE);

  // Text files hold no NUL and few other control characters; random or binary data holds many.
  const head = t.slice(0, 4096);
  let control = 0;
  for (let i = 0; i < head.length; i++) {
    const c = head.charCodeAt(i);
    if (c === 0) throw new DxfImportError('not-dxf', NOT_DXF_MESSAGE);
    if ((c < 32 && c !== 9 && c !== 10 && c !== 13) || c === 0xfffd) control++;
  }
  if (control > head.length * 0.01) throw new DxfImportError('not-dxf', NOT_DXF_MESSAGE);

  if (t.indexOf('\r') !== -1) t = t.replace(/\r\n?/g, '\n');

  // The first line of a DXF file is a group code (a whole number, usually 0 or 999) and the
  // file is made of sections.
  const firstLine = t.slice(0, Math.min(t.length, 256)).split('\n', 1)[0].trim();
  if (!/^-?\d{1,4}$/.test(firstLine) || !/(^|\n)[ \t]*0[ \t]*\n[ \t]*SECTION[ \t]*(\n|$)/.test(t.slice(0, 65536))) {
    throw new DxfImportError('not-dxf', NOT_DXF_MESSAGE);
  }
  return t;
}
