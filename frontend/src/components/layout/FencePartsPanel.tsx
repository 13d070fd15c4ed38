import { useMemo } from 'react';
import { fenceLinesOf, fenceParts } from '@shared/analysis';
import { DEFAULT_FENCE_SYSTEM } from '@shared/schemas/fenceProposal';
import { BomTable } from './BomTable';
import type { LayoutPanelProps } from './panelTypes';

/**
 * The bill of materials of the fences on the layout (drawn by hand or accepted from a proposal),
 * split with the default fence system: every polyline into runs, panels, posts and doors.
 */
export function FencePartsPanel({ layoutName, content }: LayoutPanelProps) {
  const parts = useMemo(() => fenceParts(fenceLinesOf(content.boundaries), DEFAULT_FENCE_SYSTEM), [content.boundaries]);
  const fences = content.boundaries.filter((z) => z.kind === 'fence').length;
  if (!fences) return <p className="text-xs text-ink-muted">No fences on this cell layout yet: draw one with the Fence tool or propose a guard ring.</p>;
  const s = DEFAULT_FENCE_SYSTEM;
  return (
    <div className="flex max-w-2xl flex-col gap-2 text-xs">
      <p className="text-ink-muted">
        {fences} fence{fences === 1 ? '' : 's'}, {parts.panels.length} panels and {parts.posts.length} posts, counted with panels of {s.panelWidthsMm.join(', ')} mm and {s.postWidthMm} mm posts;
        open ends are counted as line posts (the proposal marks the ones fixed to a wall).
      </p>
      <BomTable bom={parts.bom} lengthMm={parts.lengthMm} fileName="fence-parts.csv" label="Fence parts of the cell layout" layoutName={layoutName} />
      <p className="text-ink-faint">Quantities for quoting only: a competent person designs and validates the guarding under local codes (ISO 12100, ISO 10218-2, ISO 13857).</p>
    </div>
  );
}
