import { useMemo } from 'react';
import { findingId } from '@shared/analysis';
import { cn } from '../../lib/cn';
import type { LayoutPanelProps } from './panelTypes';
import { sharedZoneRows } from './sharedZoneRows';

const POINTS_SHOWN = 8;

/**
 * The shared zones of the analysis (where two arms' restricted spaces overlap): arms, area m²,
 * area at each work height, and the work points both arms reach. A row selects the boundary's finding.
 */
export function SharedZonesTable({ content, analysis, onSelect, selected }: LayoutPanelProps) {
  const labels = useMemo(() => new Map(content.arms.map((a) => [a.id, a.label])), [content.arms]);
  const rows = useMemo(() => sharedZoneRows(analysis?.sharedZones ?? []), [analysis]);
  const heights = useMemo(() => [...new Set(rows.flatMap((r) => r.byHeight.map((b) => b.height)))].sort((a, b) => a - b), [rows]);

  return (
    <section aria-label="Shared zones" className="flex flex-col gap-3">
      <p className="rounded-control border border-finding-warning bg-finding-warning-wash px-3 py-2 text-xs text-ink">
        Where two arms can be in the same place, plan interlocks or boundary-sharing logic between their controllers.
        Areas are planning estimates from nominal kinematics and the arms’ restricting limits; they cover the
        links, tool and payload at the link sizes entered, not cables or dress pack. They are no
        substitute for the risk assessment (ISO 12100), the requirements for robot systems (ISO 10218-2) or the
        arm maker’s stopping data; a competent person designs and validates the safeguarding under local codes
        and regulations.
      </p>
      {!analysis ? (
        <p className="text-sm text-ink-muted">Shared zones appear when the analysis has run.</p>
      ) : rows.length === 0 ? (
        <p className="text-sm text-ink-muted">{content.arms.length < 2 ? 'A shared zone needs at least two arms.' : 'No shared zones: no two arms\' restricted spaces overlap.'}</p>
      ) : (
        <div className="overflow-x-auto rounded-control border border-rule bg-paper-raised">
          <table aria-label="Shared zones" className="w-full border-collapse text-sm">
            <thead>
              <tr className="border-b border-rule-strong bg-paper-sunk text-left text-xs font-bold tracking-wide text-ink-muted uppercase">
                <th scope="col" className="px-3 py-2">Arms</th>
                <th scope="col" className="px-3 py-2 text-right">Area m²</th>
                {heights.map((h) => (
                  <th key={h} scope="col" className="px-3 py-2 text-right">
                    m² at {h} mm
                  </th>
                ))}
                <th scope="col" className="px-3 py-2">Work points inside</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => {
                const id = findingId('shared-zone', r.arms[0], r.arms[1]);
                const isSelected = selected?.kind === 'finding' && selected.id === id;
                const at = new Map(r.byHeight.map((b) => [b.height, b.areaM2]));
                const names = r.arms.map((a) => labels.get(a)).filter(Boolean).join(' / ');
                return (
                  <tr
                    key={id}
                    tabIndex={0}
                    aria-selected={isSelected}
                    onClick={() => onSelect({ kind: 'finding', id })}
                    onKeyDown={(event) => {
                      if (event.key === 'Enter' || event.key === ' ') {
                        event.preventDefault();
                        onSelect({ kind: 'finding', id });
                      }
                    }}
                    className={cn('cursor-pointer border-b border-rule last:border-b-0', isSelected ? 'bg-accent-wash' : 'hover:bg-paper')}
                  >
                    <td className="px-3 py-2">
                      <span className="font-bold text-shared-zone">{r.arms[0]} + {r.arms[1]}</span>
                      {names && <span className="block text-xs text-ink-muted">{names}</span>}
                    </td>
                    <td className="px-3 py-2 text-right font-bold tabular-nums">{r.areaM2.toFixed(2)}</td>
                    {heights.map((h) => (
                      <td key={h} className="px-3 py-2 text-right tabular-nums">
                        {at.has(h) ? at.get(h)!.toFixed(2) : '—'}
                      </td>
                    ))}
                    <td className="px-3 py-2" title={r.points.length > POINTS_SHOWN ? r.points.join(', ') : undefined}>
                      {r.points.length === 0 ? (
                        <span className="text-ink-faint">none</span>
                      ) : (
                        <>
                          <span className="font-bold tabular-nums">{r.points.length}</span>
                          <span className="text-ink-muted">
                            : {r.points.slice(0, POINTS_SHOWN).join(', ')}
                            {r.points.length > POINTS_SHOWN && ` … +${r.points.length - POINTS_SHOWN}`}
                          </span>
                        </>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
