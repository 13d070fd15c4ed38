// npm run dxf-check -- FOLDER: reads every DXF file under FOLDER with the product's importer
// (in a worker, as uploads are read) and prints one line per file:
//   outcome  file  unit (source) and whether the extent is plausible  layers by role  rings  notes  time
// Exit code 0 when every file was read, 1 when any was refused, 2 when FOLDER cannot be read.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { checkDrawingUnit, lengthText } from '@shared/geometry';
import { LAYER_ROLES, type ImportResult } from '@shared/schemas/floorPlan';
import { isDxfImportError } from '../src/services/dxf/errors';
import { parseInWorker } from '../src/services/dxf/parseInWorker';

/** Every file under `dir` whose name ends in .dxf (any case), sorted, as paths relative to `dir`. */
export function dxfFilesUnder(dir: string): string[] {
  const out: string[] = [];
  const walk = (rel: string) => {
    const entries = readdirSync(path.join(dir, rel), { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name));
    for (const e of entries) {
      const r = rel ? path.join(rel, e.name) : e.name;
      if (e.isDirectory()) walk(r);
      else if (e.isFile() && /\.dxf$/i.test(e.name)) out.push(r);
    }
  };
  walk('');
  return out;
}

/** The one line of a file that was read. */
export function resultLine(file: string, r: ImportResult, ms: number): string {
  const check = checkDrawingUnit(r.bounds, r.units);
  const unit = `unit ${r.units} (${r.unitsSource}) ${check.plausible ? 'plausible' : 'implausible'} ${lengthText(check.extentMm)}${check.suggestion ? `, in ${check.suggestion.units} ${lengthText(check.suggestion.extentMm)}` : ''}`;
  const byRole = LAYER_ROLES.map((role) => `${role} ${r.layers.filter((l) => l.role === role).length}`).join(', ');
  const rings = r.geometry.features.filter((f) => f.geometry.type === 'Polygon').length;
  const notes = `notes ${r.warnings.length} to check, ${r.notes.ignored.length} ignored, ${r.notes.unread.length} unread`;
  const moved = r.origin.x !== 0 || r.origin.y !== 0 ? `\tmoved by ${r.origin.x / 1000} m, ${r.origin.y / 1000} m` : '';
  return `read\t${file}\t${unit}\tlayers ${byRole}\trings ${rings}\tgaps ${r.gaps.closed} closed, ${r.gaps.open} open\t${notes}${moved}\t${ms} ms`;
}

async function main(argv: string[]): Promise<number> {
  const dir = argv[0];
  if (!dir) {
    process.stderr.write('Usage: npm run dxf-check -- FOLDER\n');
    return 2;
  }
  let files: string[];
  try {
    if (!statSync(dir).isDirectory()) throw new Error('not a folder');
    files = dxfFilesUnder(dir);
  } catch (err) {
    process.stderr.write(`dxf-check: cannot read the folder "${dir}": ${(err as Error).message}\n`);
    return 2;
  }
  let refused = 0;
  for (const file of files) {
    const t0 = performance.now();
    try {
      const r = await parseInWorker(readFileSync(path.join(dir, file)));
      process.stdout.write(`${resultLine(file, r, Math.round(performance.now() - t0))}\n`);
    } catch (err) {
      refused++;
      const ms = Math.round(performance.now() - t0);
      const why = isDxfImportError(err) ? `${err.code}: ${err.message}` : `error: ${(err as Error).message}`;
      process.stdout.write(`refused\t${file}\t${why}\t${ms} ms\n`);
    }
  }
  process.stdout.write(`${files.length} files, ${files.length - refused} read, ${refused} refused\n`);
  return refused > 0 ? 1 : 0;
}

if (import.meta.url === `file://${process.argv[1]}` || process.argv[1]?.endsWith('dxfCheck.ts')) {
  main(process.argv.slice(2)).then((code) => process.exit(code));
}
