import { useMemo, useState } from 'react';
import type { WorkPoint } from '@shared/schemas/layout';
import { Button } from '../Button';
import { Dialog, DialogActions } from '../Dialog';
import { cn } from '../../lib/cn';
import { mergeWorkPoints, parseWorkPointsCsv, type ImportMode, type WorkPointsCsvResult } from './workPointsCsv';

/** Largest file the dialog reads, bytes (a 200 000-point file is about 10 MB). */
const MAX_FILE_BYTES = 20 * 1024 * 1024;
/** The layout schema's limit on work points. */
const MAX_POINTS = 200_000;
const PREVIEW_ROWS = 100;
const ERROR_ROWS = 200;

export interface WorkPointsImportDialogProps {
  open: boolean;
  existing: ReadonlyArray<WorkPoint>;
  armIds: ReadonlyArray<string>;
  onClose(): void;
  /** Called once the user confirms; gets the layout's new list of work points. */
  onImport(points: WorkPoint[], label: string): void;
}

const MODES: Array<{ value: ImportMode; title: string; detail: string }> = [
  { value: 'merge', title: 'Add / update by id', detail: 'New ids are added; points whose id is already on the cell layout take the values from the file; the others stay.' },
  { value: 'replace', title: 'Replace all', detail: 'The cell layout keeps only the points of the file.' },
];

/** Reads a work-point CSV, shows a preview and a row-by-row error report, and imports only on confirmation. */
export function WorkPointsImportDialog({ open, existing, armIds, onClose, onImport }: WorkPointsImportDialogProps) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      width="lg"
      title="Import work points"
      description={
        <>
          A CSV file with a header row naming the columns <code>id, x, y, z</code> (plan mm) and, if wanted,{' '}
          <code>approach</code> (top / any), <code>tag</code>, <code>assignedArm</code>. Separated by comma, semicolon or tab.
        </>
      }
    >
      <ImportBody existing={existing} armIds={armIds} onClose={onClose} onImport={onImport} />
    </Dialog>
  );
}

function ImportBody({ existing, armIds, onClose, onImport }: Omit<WorkPointsImportDialogProps, 'open'>) {
  const [file, setFile] = useState<{ name: string; result: WorkPointsCsvResult } | null>(null);
  const [readError, setReadError] = useState<string | null>(null);
  const [reading, setReading] = useState(false);
  const [mode, setMode] = useState<ImportMode>('merge');

  const merged = useMemo(
    () => (file ? mergeWorkPoints(existing, file.result.points.map((p) => p.point), mode) : null),
    [file, existing, mode],
  );
  const tooMany = merged !== null && merged.points.length > MAX_POINTS;

  async function choose(f: File | undefined) {
    setFile(null);
    setReadError(null);
    if (!f) return;
    if (f.size > MAX_FILE_BYTES) {
      setReadError(`${f.name} is ${(f.size / 1048576).toFixed(1)} MB; the import reads files up to ${MAX_FILE_BYTES / 1048576} MB.`);
      return;
    }
    setReading(true);
    try {
      const text = await f.text();
      setFile({ name: f.name, result: parseWorkPointsCsv(text, { armIds }) });
    } catch (err) {
      setReadError(`Could not read ${f.name}: ${err instanceof Error ? err.message : String(err)}`);
    } finally {
      setReading(false);
    }
  }

  const r = file?.result;
  const good = r?.points.length ?? 0;
  const badRows = r ? new Set(r.errors.map((e) => e.row)).size : 0;

  return (
    <div className="flex flex-col gap-4">
      <label className="flex flex-col gap-1">
        <span className="text-xs font-bold tracking-wide text-ink-muted uppercase">CSV file</span>
        <input
          type="file"
          accept=".csv,.txt,.tsv,text/csv,text/plain"
          onChange={(event) => void choose(event.target.files?.[0])}
          className="text-sm file:mr-3 file:h-8 file:rounded-control file:border file:border-rule-strong file:bg-paper-raised file:px-3 file:text-sm file:font-bold"
        />
      </label>
      {reading && <p className="text-sm text-ink-muted">Reading …</p>}
      {readError && (
        <p role="alert" className="text-sm font-bold text-finding-critical">
          {readError}
        </p>
      )}

      {r && (
        <>
          <p className="text-sm" aria-live="polite">
            <strong>{file!.name}</strong>: {r.rowCount} row{r.rowCount === 1 ? '' : 's'} read, {good} ready to import
            {badRows > 0 && (
              <>
                , <span className="font-bold text-finding-critical">{badRows} with errors</span> (not imported)
              </>
            )}
            . Rows are counted as a spreadsheet shows them: the header is row 1.
          </p>

          {r.notes.length > 0 && (
            <ul className="list-disc pl-5 text-sm text-ink-muted">
              {r.notes.map((n) => (
                <li key={n}>{n}</li>
              ))}
            </ul>
          )}

          {r.errors.length > 0 && (
            <section aria-label="Errors by row" className="max-h-40 overflow-y-auto rounded-control border border-finding-critical bg-finding-critical-wash px-3 py-2">
              <ul className="text-sm text-finding-critical">
                {r.errors.slice(0, ERROR_ROWS).map((e, i) => (
                  <li key={i}>
                    row {e.row}: {e.message}
                  </li>
                ))}
                {r.errors.length > ERROR_ROWS && <li>… and {r.errors.length - ERROR_ROWS} more</li>}
              </ul>
            </section>
          )}

          {good > 0 && <PreviewTable rows={r.points.slice(0, PREVIEW_ROWS).map((p) => ({ row: p.row, ...p.point }))} more={good - PREVIEW_ROWS} />}

          {good > 0 && (
            <fieldset className="flex flex-col gap-2">
              <legend className="mb-1 text-xs font-bold tracking-wide text-ink-muted uppercase">How to bring them in</legend>
              {MODES.map((m) => (
                <label key={m.value} className={cn('flex gap-2 rounded-control border px-3 py-2 text-sm', mode === m.value ? 'border-accent bg-accent-wash' : 'border-rule')}>
                  <input type="radio" name="import-mode" value={m.value} checked={mode === m.value} onChange={() => setMode(m.value)} />
                  <span>
                    <span className="font-bold">{m.title}</span> — {m.detail}
                  </span>
                </label>
              ))}
              {merged && (
                <p className="text-sm text-ink-muted">
                  After the import: {merged.points.length} points ({merged.added} added, {merged.updated} updated
                  {merged.removed > 0 && <span className="font-bold text-finding-warning">, {merged.removed} removed</span>}).
                </p>
              )}
              {tooMany && (
                <p role="alert" className="text-sm font-bold text-finding-critical">
                  A cell layout holds at most {MAX_POINTS.toLocaleString()} work points.
                </p>
              )}
            </fieldset>
          )}
        </>
      )}

      <DialogActions>
        <Button variant="quiet" onClick={onClose}>
          Cancel
        </Button>
        <Button
          variant="primary"
          disabled={!merged || good === 0 || tooMany}
          onClick={() => {
            if (!merged || !file) return;
            onImport(merged.points, `Import ${good} work point${good === 1 ? '' : 's'} from ${file.name} (${mode === 'replace' ? 'replace all' : 'add / update'})`);
            onClose();
          }}
        >
          {good === 0 ? 'Import' : `Import ${good} point${good === 1 ? '' : 's'}${badRows ? `, skip ${badRows} row${badRows === 1 ? '' : 's'}` : ''}`}
        </Button>
      </DialogActions>
    </div>
  );
}

function PreviewTable({ rows, more }: { rows: Array<WorkPoint & { row: number }>; more: number }) {
  return (
    <div className="max-h-56 overflow-auto rounded-control border border-rule">
      <table aria-label="Preview of the rows to import" className="w-full border-collapse text-xs">
        <thead className="sticky top-0 bg-paper-sunk text-left text-ink-muted uppercase">
          <tr>
            {['row', 'id', 'x', 'y', 'z', 'approach', 'tag', 'arm'].map((h) => (
              <th key={h} scope="col" className={cn('px-2 py-1 font-bold', ['row', 'x', 'y', 'z'].includes(h) && 'text-right')}>
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((p) => (
            <tr key={p.row} className="border-t border-rule">
              <td className="px-2 py-1 text-right text-ink-faint tabular-nums">{p.row}</td>
              <td className="px-2 py-1 font-bold">{p.id}</td>
              <td className="px-2 py-1 text-right tabular-nums">{p.x}</td>
              <td className="px-2 py-1 text-right tabular-nums">{p.y}</td>
              <td className="px-2 py-1 text-right tabular-nums">{p.z}</td>
              <td className="px-2 py-1">{p.approach}</td>
              <td className="px-2 py-1">{p.tag}</td>
              <td className="px-2 py-1">{p.assignedArm ?? ''}</td>
            </tr>
          ))}
          {more > 0 && (
            <tr className="border-t border-rule">
              <td colSpan={8} className="px-2 py-1 text-ink-muted">
                … and {more} more
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
