import { isReached } from '@shared/analysis';
import { useCallback, useEffect, useEffectEvent, useMemo, useRef, useState } from 'react';
import { getCoreRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortingState, flexRender } from '@tanstack/react-table';
import type { WorkPoint } from '@shared/schemas/layout';
import { Button } from '../Button';
import { cn } from '../../lib/cn';
import type { LayoutPanelProps } from './panelTypes';
import { WorkPointCell } from './WorkPointCell';
import { WorkPointsImportDialog } from './WorkPointsImportDialog';
import { editWorkPoint, filterWorkPointRows, newWorkPoint, removeWorkPoints, workPointRows, type EditableField, type WorkPointRow } from './workPointRows';
import { workPointsToCsv } from './workPointsCsv';
import { APPROACH_LABEL, layoutStateWords } from '@shared/words';
import { exportNotes } from '@shared/safety';

const ROW_HEIGHT = 34;
const VIEW_HEIGHT = 420;
const OVERSCAN = 8;
const SORT_MARK = { asc: '▲', desc: '▼' } as const;

const HEADER_TITLES: Record<string, string> = {
  assignedArm: 'Assigned arm',
  best: 'Best margin over the arms, mm: + reached with room to spare, − short of reach',
  reachedBy: 'Arms that reach the point, best first',
};

const APPROACH_OPTIONS = Object.entries(APPROACH_LABEL).map(([value, label]) => ({ value, label }));

const fmtMm = (v: number) => (Number.isInteger(v) ? String(v) : v.toFixed(1));

/**
 * The layout's work points as a table: sort by any column, filter by words, edit cells in place
 * (checked with the WorkPoint schema), add and delete points, import and export CSV. Rows are
 * windowed (only the rows in view are in the DOM), so 10⁴ points scroll smoothly.
 */
export function WorkPointsPanel({ layoutName, content, analysis, readOnly, onEdit, onSelect, selected }: LayoutPanelProps) {
  const points = content.workPoints;
  const armIds = useMemo(() => content.arms.map((a) => a.id), [content.arms]);
  const armOptions = useMemo(
    () => [{ value: '', label: '— none —' }, ...content.arms.map((a) => ({ value: a.id, label: a.label ? `${a.id} · ${a.label}` : a.id }))],
    [content.arms],
  );
  const rows = useMemo(() => workPointRows(points, armIds, analysis), [points, armIds, analysis]);
  const [filter, setFilter] = useState('');
  const filtered = useMemo(() => filterWorkPointRows(rows, filter), [rows, filter]);
  const [sorting, setSorting] = useState<SortingState>([]);
  const [checked, setChecked] = useState<ReadonlySet<string>>(new Set());
  const [importing, setImporting] = useState(false);
  const [scrollTop, setScrollTop] = useState(0);
  const scroller = useRef<HTMLDivElement>(null);

  // Forget checked ids that are gone (deleted, renamed, undone).
  useEffect(() => {
    const ids = new Set(points.map((p) => p.id));
    setChecked((c) => ([...c].every((id) => ids.has(id)) ? c : new Set([...c].filter((id) => ids.has(id)))));
  }, [points]);

  // The cells commit through this, so the columns are rebuilt whenever what it closes over changes.
  const commit = useCallback(
    (id: string, field: EditableField, raw: string): string | null => {
      const outcome = editWorkPoint(points, id, field, raw, armIds);
      if (!outcome.ok) return outcome.message;
      onEdit({ ...content, workPoints: outcome.points }, `Edit ${field === 'assignedArm' ? 'assigned arm' : field} of work point ${id}`);
      if (outcome.point.id !== id && selected?.kind === 'point' && selected.id === id) onSelect({ kind: 'point', id: outcome.point.id });
      return null;
    },
    [points, armIds, onEdit, content, selected, onSelect],
  );

  const columns = useMemo<ColumnDef<WorkPointRow, unknown>[]>(() => {
    const cell = (field: EditableField, text: (p: WorkPoint) => string, opts: { options?: typeof armOptions; align?: 'right' } = {}) =>
      ({ row }: { row: { original: WorkPointRow } }) => (
        <WorkPointCell
          pointId={row.original.point.id}
          field={field}
          text={text(row.original.point)}
          readOnly={readOnly}
          options={opts.options}
          align={opts.align}
          onCommit={(raw) => commit(row.original.point.id, field, raw)}
        />
      );
    return [
      { id: 'id', header: 'Id', accessorFn: (r) => r.point.id, cell: cell('id', (p) => p.id), size: 72 },
      { id: 'x', header: 'x mm', accessorFn: (r) => r.point.x, cell: cell('x', (p) => fmtMm(p.x), { align: 'right' }), size: 76 },
      { id: 'y', header: 'y mm', accessorFn: (r) => r.point.y, cell: cell('y', (p) => fmtMm(p.y), { align: 'right' }), size: 76 },
      { id: 'z', header: 'z above floor mm', accessorFn: (r) => r.point.z, cell: cell('z', (p) => fmtMm(p.z), { align: 'right' }), size: 64 },
      {
        id: 'approach', header: 'Approach', accessorFn: (r) => r.point.approach, size: 76,
        cell: cell('approach', (p) => p.approach, { options: APPROACH_OPTIONS }),
      },
      { id: 'tag', header: 'Tag', accessorFn: (r) => r.point.tag, cell: cell('tag', (p) => p.tag), size: 100 },
      { id: 'assignedArm', header: 'Assigned arm', accessorFn: (r) => r.point.assignedArm ?? '', cell: cell('assignedArm', (p) => p.assignedArm ?? '', { options: armOptions }), size: 72 },
      {
        id: 'best', header: 'Margin mm', size: 84,
        accessorFn: (r) => r.best ?? undefined, sortUndefined: 'last',
        cell: ({ row }) => <MarginText value={row.original.best} />,
      },
      {
        id: 'reachedBy', header: 'Reached by', size: 88,
        accessorFn: (r) => r.reachedBy.join(' '),
        cell: ({ row }) => (row.original.best === null ? <span className="text-ink-faint">—</span> : row.original.reachedBy.length ? row.original.reachedBy.join(', ') : <span className="font-bold text-finding-critical">no arm</span>),
      },
    ];
  }, [armOptions, readOnly, commit]);

  // eslint-disable-next-line react-hooks/incompatible-library -- the table is read afresh on every render and never passed to a memo, which is what this library needs
  const table = useReactTable({
    data: filtered,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: (r) => r.point.id,
  });
  const tableRows = table.getRowModel().rows;

  // Bring the selected point into view when it was picked elsewhere (plan, matrix, findings): only
  // when the selection changes, not on every edit, so the rows are read as they are at that moment.
  const bringSelectedIntoView = useEffectEvent(() => {
    if (selected?.kind !== 'point' || !scroller.current) return;
    const i = tableRows.findIndex((r) => r.id === selected.id);
    if (i < 0) return;
    const el = scroller.current;
    const top = i * ROW_HEIGHT;
    const head = 36;
    if (top < el.scrollTop || top + ROW_HEIGHT > el.scrollTop + el.clientHeight - head) el.scrollTop = Math.max(0, top - el.clientHeight / 3);
  });
  useEffect(() => {
    bringSelectedIntoView();
  }, [selected?.kind, selected?.id]);

  const first = Math.max(0, Math.floor(scrollTop / ROW_HEIGHT) - OVERSCAN);
  const last = Math.min(tableRows.length, Math.ceil((scrollTop + VIEW_HEIGHT) / ROW_HEIGHT) + OVERSCAN);
  const visibleIds = tableRows.map((r) => r.id);
  const allChecked = visibleIds.length > 0 && visibleIds.every((id) => checked.has(id));
  const unreached = rows.filter((r) => r.best !== null && !isReached(r.best)).length;

  const add = () => {
    const p = newWorkPoint(points);
    onEdit({ ...content, workPoints: [...points, p] }, `Add work point ${p.id}`);
    onSelect({ kind: 'point', id: p.id });
  };
  const removeChecked = () => {
    const n = checked.size;
    onEdit({ ...content, workPoints: removeWorkPoints(points, checked) }, `Delete ${n} work point${n === 1 ? '' : 's'}`);
    if (selected?.kind === 'point' && checked.has(selected.id)) onSelect(null);
    setChecked(new Set());
  };
  const exportCsv = () => {
    // A BOM makes spreadsheets read the file as UTF-8 (common practice); the import strips it.
    const blob = new Blob(['\uFEFF', workPointsToCsv(points, armIds, analysis?.coverage ?? null, exportNotes({ what: 'work points', layoutName, state: layoutStateWords(null), at: new Date() }))], { type: 'text/csv;charset=utf-8' });
    const url = URL.createObjectURL(blob);
    const a = document.createElement('a');
    a.href = url;
    a.download = 'work-points.csv';
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 0);
  };

  return (
    <section aria-label="Work points" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <label className="flex flex-col gap-1">
          <span className="text-xs font-bold tracking-wide text-ink-muted uppercase">Filter points</span>
          <input
            type="search"
            value={filter}
            onChange={(event) => setFilter(event.target.value)}
            placeholder="id, tag, arm … or “not reached”"
            className="h-9 w-64 rounded-control border border-rule-strong bg-paper-raised px-3 text-sm placeholder:text-ink-faint"
          />
        </label>
        <div className="flex flex-wrap gap-2">
          {!readOnly && (
            <>
              <Button size="sm" onClick={add}>Add point</Button>
              <Button size="sm" variant="danger" disabled={checked.size === 0} onClick={removeChecked}>
                Delete selected{checked.size ? ` (${checked.size})` : ''}
              </Button>
              <Button size="sm" onClick={() => setImporting(true)}>Import CSV…</Button>
            </>
          )}
          <Button size="sm" disabled={points.length === 0} onClick={exportCsv}>Export CSV</Button>
        </div>
      </div>
      <p className="text-xs text-ink-muted" aria-live="polite">
        {points.length} point{points.length === 1 ? '' : 's'}
        {filter.trim() && `, ${filtered.length} shown`}
        {analysis ? (unreached ? <>, <span className="font-bold text-finding-critical">{unreached} not reached</span></> : ', all reached') : ' · margins appear when the analysis has run'}
      </p>

      <div
        ref={scroller}
        onScroll={(event) => setScrollTop(event.currentTarget.scrollTop)}
        style={{ maxHeight: VIEW_HEIGHT }}
        className="overflow-auto rounded-control border border-rule bg-paper-raised"
      >
        <table aria-label="Work points" aria-rowcount={tableRows.length + 1} className="w-full table-fixed border-collapse text-sm">
          <colgroup>
            <col style={{ width: 36 }} />
            {table.getVisibleLeafColumns().map((c) => <col key={c.id} style={{ width: c.getSize() }} />)}
          </colgroup>
          <thead className="sticky top-0 z-10">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-rule-strong bg-paper-sunk">
                <th scope="col" className="px-2">
                  <input
                    type="checkbox"
                    aria-label="Select all shown points"
                    disabled={readOnly || visibleIds.length === 0}
                    checked={allChecked}
                    onChange={() => setChecked(allChecked ? new Set() : new Set(visibleIds))}
                  />
                </th>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                      title={HEADER_TITLES[header.id]}
                      className="px-2 py-2 text-left text-xs font-bold tracking-wide text-ink-muted uppercase"
                    >
                      <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 uppercase hover:text-ink">
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        <span aria-hidden className={cn('text-[0.6rem]', !sorted && 'invisible')}>{sorted ? SORT_MARK[sorted] : SORT_MARK.asc}</span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {first > 0 && <tr aria-hidden style={{ height: first * ROW_HEIGHT }} />}
            {tableRows.slice(first, last).map((row, i) => {
              const id = row.id;
              const isSelected = selected?.kind === 'point' && selected.id === id;
              const short = row.original.best !== null && !isReached(row.original.best);
              return (
                <tr
                  key={id}
                  aria-rowindex={first + i + 2}
                  aria-selected={isSelected}
                  onClick={() => onSelect({ kind: 'point', id })}
                  style={{ height: ROW_HEIGHT }}
                  className={cn(
                    'cursor-pointer border-b border-rule',
                    isSelected ? 'bg-accent-wash' : 'hover:bg-paper',
                    short && !isSelected && 'bg-finding-critical-wash/50',
                  )}
                >
                  <td className="px-2" onClick={(event) => event.stopPropagation()}>
                    <input
                      type="checkbox"
                      aria-label={`Select ${id}`}
                      disabled={readOnly}
                      checked={checked.has(id)}
                      onChange={() => setChecked((c) => {
                        const next = new Set(c);
                        if (next.has(id)) next.delete(id);
                        else next.add(id);
                        return next;
                      })}
                    />
                  </td>
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="truncate px-1 align-middle">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              );
            })}
            {last < tableRows.length && <tr aria-hidden style={{ height: (tableRows.length - last) * ROW_HEIGHT }} />}
            {tableRows.length === 0 && (
              <tr>
                <td colSpan={columns.length + 1} className="px-3 py-6 text-ink-muted">
                  {points.length === 0 ? (readOnly ? 'This cell layout has no work points.' : 'No work points yet: add one, or import a CSV file.') : 'No point matches the filter.'}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>

      {!readOnly && (
        <WorkPointsImportDialog
          open={importing}
          existing={points}
          armIds={armIds}
          onClose={() => setImporting(false)}
          onImport={(next, label) => onEdit({ ...content, workPoints: next }, label)}
        />
      )}
    </section>
  );
}

function MarginText({ value }: { value: number | null }) {
  if (value === null) return <span className="block text-right text-ink-faint">—</span>;
  return (
    <span
      title={value < 0 ? `Best arm is ${fmtMm(-value)} mm short` : `Reached with ${fmtMm(value)} mm to spare`}
      className={cn('block text-right font-bold tabular-nums', value < 0 ? 'text-finding-critical' : 'text-ink')}
    >
      {value < 0 ? `−${fmtMm(-value)}` : `+${fmtMm(value)}`}
    </span>
  );
}
