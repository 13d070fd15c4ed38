// `npm run dxf-check -- FOLDER` over the sample floor plans and over a folder of hand-written
// drawings: one line per file, in the order of the file names, and the exit code.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { SAMPLES_DIR, entitiesDxf } from './support';

const ROOT = path.resolve(SAMPLES_DIR, '../..');

function dxfCheck(folder: string) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(ROOT, 'backend/scripts/dxfCheck.ts'), folder], {
    cwd: ROOT,
    encoding: 'utf8',
    timeout: 120_000,
  });
  return { code: r.status, lines: r.stdout.trim().split('\n'), stderr: r.stderr };
}

// each run starts a worker per file: allow for a loaded machine
describe('dxf-check', { timeout: 120_000 }, () => {
  it('prints one line per sample floor plan: read, unit and plausibility, layers by role, rings, notes, time', () => {
    const { code, lines } = dxfCheck(SAMPLES_DIR);
    expect(code).toBe(0);
    expect(lines).toHaveLength(5);
    const files = ['fernhill-hall-inches.dxf', 'fernhill-hall-r12.dxf', 'fernhill-hall-rounded.dxf', 'fernhill-hall.dxf'];
    lines.slice(0, 4).forEach((line, i) => {
      const cols = line.split('\t');
      expect(cols[0]).toBe('read');
      expect(cols[1]).toBe(files[i]);
      expect(cols[2]).toMatch(/^unit (mm|in) \((header|default)\) plausible 24 m$/);
      expect(cols[3]).toBe('layers outline 1, wall 1, column 1, obstacle 1, ignore 2');
      expect(cols[4]).toBe('rings 13');
      expect(cols[5]).toBe('gaps 0 closed, 0 open');
      expect(cols[6]).toMatch(/^notes \d+ to check, \d+ ignored, 0 unread$/);
      expect(cols[cols.length - 1]).toMatch(/^\d+ ms$/);
    });
    expect(lines[1]).toContain('unit mm (default)'); // the R12 sample has no $INSUNITS
    expect(lines[4]).toBe('4 files, 4 read, 0 refused');
  });

  it('flags a drawing in the wrong unit, moves a map-grid one, names a refused file, and exits 1', () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'dxf-check-'));
    try {
      mkdirSync(path.join(dir, 'site'));
      const square = (x: number, y: number, s: number): Array<[number, string | number]> => [
        [0, 'LWPOLYLINE'], [8, 'OUTLINE'], [90, 4], [70, 1], [10, x], [20, y], [10, x + s], [20, y], [10, x + s], [20, y + s], [10, x], [20, y + s],
      ];
      writeFileSync(path.join(dir, 'a-house.dxf'), entitiesDxf(square(0, 0, 870)));
      writeFileSync(path.join(dir, 'site', 'grid.DXF'), entitiesDxf(square(500_000_000, 5_000_000_000, 40_000)));
      writeFileSync(path.join(dir, 'broken.dxf'), '0\nSECTION\n2\nENTITIES\n0\nLINE\nten\n');
      writeFileSync(path.join(dir, 'notes.txt'), 'not a drawing');
      const { code, lines } = dxfCheck(dir);
      expect(code).toBe(1);
      expect(lines).toHaveLength(4);
      expect(lines[0]).toMatch(/^read\ta-house\.dxf\tunit mm \(header\) implausible 0\.87 m, in in 22 m\t/);
      expect(lines[1]).toMatch(/^refused\tbroken\.dxf\tparse-error: /);
      expect(lines[2]).toMatch(/^read\tsite\/grid\.DXF\tunit mm \(header\) plausible 40 m\t.*\tmoved by 500000 m, 5000000 m\t\d+ ms$/);
      expect(lines[3]).toBe('3 files, 2 read, 1 refused');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
