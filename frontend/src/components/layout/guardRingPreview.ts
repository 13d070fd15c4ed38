/**
 * The proposed guard ring drawn over the plan before it is accepted: fence lines dashed in the
 * proposal colour, doors as open gaps with a bar, posts as small squares of the post width (plan
 * mm, y north; strokes keep their screen width). d3 joins only.
 */
import type { Selection } from 'd3';
import type { FenceProposal } from '@shared/analysis';
import type { OverlayOptions } from '../../plan/planTypes';

type G = Selection<SVGGElement, unknown, null, undefined>;

export const GUARD_RING_PREVIEW: Required<OverlayOptions> & { name: string } = { name: 'guard-ring-preview', space: 'plan', order: 35 };
/** How the preview looks on screen: a dashed line in the accent colour, doors with a wash. */
export const PREVIEW_LOOK = { colour: 'var(--color-accent)', width: 2.5, dash: '9 5', door: 'var(--color-accent-wash)', doorWidth: 6 } as const;

const pathOf = (pts: ReadonlyArray<readonly [number, number]>) => pts.map((p, i) => `${i ? 'L' : 'M'}${p[0]},${p[1]}`).join('');

export function drawGuardRingPreview(layer: G, proposal: FenceProposal | null, postWidthMm: number): void {
  const fences = proposal?.boundaries.filter((z) => z.kind === 'fence') ?? [];
  const doors = proposal?.boundaries.filter((z) => z.kind === 'opening') ?? [];
  layer
    .selectAll<SVGPathElement, (typeof fences)[number]>('path.ring-line')
    .data(fences, (z) => z.id)
    .join('path')
    .attr('class', 'ring-line')
    .attr('data-preview-fence', (z) => z.id)
    .attr('d', (z) => pathOf(z.points))
    .attr('fill', 'none')
    .attr('vector-effect', 'non-scaling-stroke')
    .style('stroke', PREVIEW_LOOK.colour)
    .style('stroke-width', PREVIEW_LOOK.width)
    .style('stroke-dasharray', PREVIEW_LOOK.dash)
    .style('pointer-events', 'none');
  layer
    .selectAll<SVGPathElement, (typeof doors)[number]>('path.ring-door')
    .data(doors, (z) => z.id)
    .join('path')
    .attr('class', 'ring-door')
    .attr('data-preview-door', (z) => z.id)
    .attr('d', (z) => pathOf(z.points))
    .attr('fill', 'none')
    .attr('vector-effect', 'non-scaling-stroke')
    .style('stroke', PREVIEW_LOOK.door)
    .style('stroke-width', PREVIEW_LOOK.doorWidth)
    .style('pointer-events', 'none');
  const posts = proposal?.parts.posts ?? [];
  const h = postWidthMm / 2;
  layer
    .selectAll<SVGPathElement, null>('path.ring-posts')
    .data(posts.length ? [null] : [])
    .join('path')
    .attr('class', 'ring-posts')
    .attr('d', posts.map((p) => `M${p.at[0] - h},${p.at[1] - h}h${2 * h}v${2 * h}h${-2 * h}Z`).join(''))
    .style('fill', PREVIEW_LOOK.colour)
    .style('pointer-events', 'none');
}
