/**
 * Moves the entities of DXF text (ENTITIES and BLOCKS sections) by dx, dy: every point's x
 * (group codes 10–18) and y (20–28). Used to put a layout drawn at a floor plan's local origin
 * back where the building lies in its drawing (map grid coordinates). Text unchanged at 0, 0.
 */
export function moveDxfEntities(dxf: string, dx: number, dy: number): string {
  if (dx === 0 && dy === 0) return dxf;
  const eol = dxf.includes('\r\n') ? '\r\n' : '\n';
  const lines = dxf.split(eol);
  let section = '';
  for (let i = 0; i + 1 < lines.length; i += 2) {
    const code = Number.parseInt(lines[i], 10);
    const value = lines[i + 1].trim();
    if (code === 0 && value === 'SECTION') {
      section = (lines[i + 3] ?? '').trim();
      continue;
    }
    if (code === 0 && value === 'ENDSEC') section = '';
    if (section !== 'ENTITIES' && section !== 'BLOCKS') continue;
    const shift = code >= 10 && code <= 18 ? dx : code >= 20 && code <= 28 ? dy : 0;
    if (shift === 0) continue;
    const v = Number.parseFloat(value);
    if (Number.isFinite(v)) lines[i + 1] = String(Math.round((v + shift) * 1e6) / 1e6);
  }
  return lines.join(eol);
}
