import { useEffect, useRef, useState } from 'react';
import type { SectionResult } from '@shared/analysis';
import type { ArmPlacement } from '@shared/schemas/layout';
import { Button } from '../Button';
import { drawSection, SECTION_ARM_COLOURS } from './sectionDraw';

/** The caution under every section (docs/product.md "Cautions"), in the section's own terms. */
export const SECTION_CAUTION =
  'Planning estimate: the cut shows the whole moving arm (links, tool and payload at the link sizes entered) from nominal kinematics, and the distances are read off it. ' +
  'Check them against the arm maker’s data; they do not replace the risk assessment (ISO 12100), ISO 10218-2 or the maker’s stopping data. ' +
  'Guarding must be designed and validated by a competent person under the local codes and regulations.';

export interface SectionViewProps {
  /** The side view from the worker; null while there is no line (or no answer yet). */
  section: SectionResult | null;
  /** Whether a line is drawn (the answer may still be on its way). */
  hasLine: boolean;
  arms: ReadonlyArray<ArmPlacement>;
  busy: boolean;
  onClear(): void;
}

const metres = (mm: number) => `${(mm / 1000).toFixed(2)} m`;

/** The side view along the section line: React owns the state, d3 draws the svg under one ref. */
export function SectionView({ section, hasLine, arms, busy, onClear }: SectionViewProps) {
  const box = useRef<HTMLDivElement>(null);
  const svg = useRef<SVGSVGElement>(null);
  const [width, setWidth] = useState(0);

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setWidth(el.clientWidth));
    ro.observe(el);
    setWidth(el.clientWidth);
    return () => ro.disconnect();
  }, [hasLine]);

  useEffect(() => {
    if (!svg.current || !section || width <= 0) return;
    const index = new Map(arms.map((a, i) => [a.id, i]));
    drawSection(svg.current, section, {
      width,
      height: 380,
      colourOf: (id) => SECTION_ARM_COLOURS[(index.get(id) ?? 0) % SECTION_ARM_COLOURS.length],
      labelOf: (id) => {
        const a = arms.find((x) => x.id === id);
        return a?.label ? `${id} ${a.label}` : id;
      },
    });
  }, [section, width, arms]);

  if (!hasLine) {
    return (
      <section aria-label="Section" className="rounded-control border border-dashed border-rule-strong bg-paper-raised px-3 py-4 text-sm text-ink-muted" data-section-empty>
        Draw a section line on the plan with the Section tool (key S): click where it starts, then where it ends. The side view along it appears here.
      </section>
    );
  }

  return (
    <section aria-label="Section" className="flex flex-col gap-2 rounded-control border border-rule bg-paper-raised px-3 py-2" data-section-view aria-busy={busy || undefined}>
      <div className="flex items-center gap-3">
        <h3 className="text-sm font-bold">Section A–A′</h3>
        {section && <span className="text-xs text-ink-muted">{metres(section.lengthMm)} along the line · heights above the floor, mm</span>}
        <Button size="sm" variant="quiet" className="ml-auto" onClick={onClear}>
          Clear section
        </Button>
      </div>
      <div ref={box} className="min-h-[380px] w-full">
        {section ? <svg ref={svg} role="img" aria-label="Side view along the section line" /> : <p className="text-xs text-ink-muted">Cutting…</p>}
      </div>
      {section && (
        <ul className="flex flex-col gap-0.5 text-xs" aria-label="Section dimensions" data-section-dimensions>
          {section.dimensions.map((d, i) => (
            <li key={`${d.fenceId}:${i}`} data-fence={d.fenceId}>
              <span className="font-bold">Fence {d.fenceId}</span> at {metres(d.s)}: b = {Math.round(d.b)} mm
              {d.a !== null && d.c !== null ? (
                <>
                  , a = {Math.round(d.a)} mm, c = {Math.round(d.c)} mm{d.armId ? ` (to ${d.armId})` : ''}
                </>
              ) : (
                ' — no arm space on this line'
              )}
            </li>
          ))}
          {section.dimensions.length === 0 && <li className="text-ink-muted">The line crosses no fence.</li>}
          {section.arms.length === 0 && <li className="text-ink-muted">No arm’s space lies on this line.</li>}
        </ul>
      )}
      <p className="text-xs text-ink-muted" data-caution>
        b = fence height, a = highest point of the arms’ space on the line, c = horizontal distance from the fence to it. {SECTION_CAUTION}
      </p>
    </section>
  );
}
