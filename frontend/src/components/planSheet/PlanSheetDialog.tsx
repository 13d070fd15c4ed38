import { useState } from 'react';
import { errorMessage } from '../../api/client';
import { SHEET_KINDS, SHEET_SCALES, SHEET_SIZES, saveBlob, useLayoutDxf, useRenderPlanSheet, type PlanSheetRequest, type SheetKind, type SheetSize } from '../../api/planSheets';
import { Button } from '../Button';
import { Dialog } from '../Dialog';
import { SheetPreview } from './SheetPreview';

export interface PlanSheetDialogProps {
  open: boolean;
  onClose(): void;
  layoutId: number;
  layoutName: string;
}

const fileBase = (name: string) => name.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '') || 'layout';

/** Export of the working copy: paper size, scale, sheets; the server renders, page 1 is previewed, then downloaded. */
export function PlanSheetDialog({ open, onClose, layoutId, layoutName }: PlanSheetDialogProps) {
  const [size, setSize] = useState<SheetSize>('A3');
  const [scale, setScale] = useState<PlanSheetRequest['scale']>('auto');
  // The fence-parts sheet is ticked by choice, as the server prints it only when named.
  const [sheets, setSheets] = useState<SheetKind[]>(SHEET_KINDS.map((s) => s.kind).filter((k) => k !== 'fences'));
  const render = useRenderPlanSheet();
  const dxf = useLayoutDxf();
  const pdf = render.data ?? null;
  const stale = render.variables && (render.variables.size !== size || render.variables.scale !== scale || render.variables.sheets.join() !== sheets.join());

  const toggle = (k: SheetKind) => setSheets((cur) => (cur.includes(k) ? cur.filter((c) => c !== k) : SHEET_KINDS.map((s) => s.kind).filter((s) => s === k || cur.includes(s))));

  return (
    <Dialog open={open} onClose={onClose} title="Export plan sheet" width="lg" description="A draft sheet of the working copy, marked not for construction. Released sheets come from signed-off revisions.">
      <div className="flex flex-col gap-3 px-5 pb-4">
        <div className="flex flex-wrap items-end gap-4">
          <label className="flex flex-col gap-1 text-xs font-bold">
            Paper (landscape)
            <select aria-label="Paper size" value={size} onChange={(e) => setSize(e.target.value as SheetSize)} className="h-8 rounded-control border border-rule-strong bg-paper-raised px-2 text-sm font-normal">
              {SHEET_SIZES.map((s) => (
                <option key={s} value={s}>
                  {s}
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col gap-1 text-xs font-bold">
            Scale
            <select
              aria-label="Scale"
              value={String(scale)}
              onChange={(e) => setScale(e.target.value === 'auto' ? 'auto' : (Number(e.target.value) as PlanSheetRequest['scale']))}
              className="h-8 rounded-control border border-rule-strong bg-paper-raised px-2 text-sm font-normal"
            >
              <option value="auto">Largest that fits</option>
              {SHEET_SCALES.map((n) => (
                <option key={n} value={n}>
                  1:{n}
                </option>
              ))}
            </select>
          </label>
          <fieldset className="flex flex-wrap items-center gap-x-3 gap-y-1 text-xs">
            <legend className="mb-1 font-bold">Sheets</legend>
            {SHEET_KINDS.map((s) => (
              <label key={s.kind} className="flex items-center gap-1">
                <input type="checkbox" checked={sheets.includes(s.kind)} onChange={() => toggle(s.kind)} />
                {s.text}
              </label>
            ))}
          </fieldset>
        </div>
        <div className="flex items-center gap-2">
          <Button variant="primary" busy={render.isPending} disabled={!sheets.length} onClick={() => render.mutate({ layoutId, size, scale, sheets })}>
            {render.isPending ? 'Rendering…' : pdf ? 'Render again' : 'Render preview'}
          </Button>
          <Button disabled={!pdf || render.isPending} onClick={() => pdf && saveBlob(pdf, `${fileBase(layoutName)}-working-copy.pdf`)}>
            Download
          </Button>
          <span aria-hidden className="mx-1 h-5 w-px bg-rule" />
          <Button
            variant="quiet"
            busy={dxf.isPending}
            onClick={() => dxf.mutate(layoutId, { onSuccess: (blob) => saveBlob(blob, `${fileBase(layoutName)}.dxf`) })}
          >
            Download DXF
          </Button>
          {render.isPending && (
            <output className="text-xs text-ink-muted" aria-live="polite">
              The server is drawing the sheets…
            </output>
          )}
          {stale && !render.isPending && <span className="text-xs text-ink-muted">Options changed: render again to see them.</span>}
        </div>
        {render.error && <p role="alert" className="text-sm text-finding-critical">{errorMessage(render.error)}</p>}
        {dxf.error && <p role="alert" className="text-sm text-finding-critical">{errorMessage(dxf.error)}</p>}
        {pdf && <SheetPreview pdf={pdf} />}
        <p className="text-xs text-ink-muted">
          Sheets carry the planning cautions: regions are estimates from nominal kinematics and do not replace the risk assessment, the robot-system safety
          requirements or the maker&apos;s stopping data.
        </p>
      </div>
    </Dialog>
  );
}
