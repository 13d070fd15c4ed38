import type { ReactNode } from 'react';
import { BOUNDARY_STYLES, type MarkKind, type ScreenLook } from '@shared/style/boundaryStyles';
import { PLAN_NORTH } from '@shared/words';
import type { LayerRole } from '@shared/schemas/floorPlan';
import type { LayerStyle } from '../../plan/planCanvas';
import { ROLE_LABEL, ROLE_STYLE } from '../floorPlan/layerRoles';
import { cn } from '../../lib/cn';

/** One row of the key: the mark kind it shows and the words beside it. */
export interface KeyRow {
  kind: MarkKind;
  text: string;
}

/**
 * The rows of the editor's key, in the plan sheet legend's order and with its words
 * (BOUNDARY_STYLES legend texts), so screen and paper explain the same marks the same way.
 */
export const KEY_ROWS: readonly KeyRow[] = [
  { kind: 'armBase', text: BOUNDARY_STYLES.armBase.legend },
  { kind: 'maxSpace', text: BOUNDARY_STYLES.maxSpace.legend },
  { kind: 'restricted', text: BOUNDARY_STYLES.restricted.legend },
  { kind: 'band', text: BOUNDARY_STYLES.band.legend },
  { kind: 'shared', text: BOUNDARY_STYLES.shared.legend },
  { kind: 'fence', text: BOUNDARY_STYLES.fence.legend },
  { kind: 'opening', text: BOUNDARY_STYLES.opening.legend },
  { kind: 'operator', text: BOUNDARY_STYLES.operator.legend },
  { kind: 'keepout', text: BOUNDARY_STYLES.keepout.legend },
  { kind: 'pointReached', text: 'Work point reached by an arm' },
  { kind: 'pointUnreached', text: 'Work point no arm reaches' },
];

/** Floor-plan roles the key explains (ignored layers are drawn faintly and need no row). */
const FLOOR_ROLES: readonly LayerRole[] = ['outline', 'wall', 'column', 'obstacle'];

const W = 28;
const H = 14;

function Hatch({ id, look }: { id: string; look: ScreenLook }) {
  const s = look.hatch?.spacingPx ?? 6;
  return (
    <defs>
      <pattern id={id} patternUnits="userSpaceOnUse" width={s} height={s} patternTransform="rotate(45)">
        <line x1={0} y1={0} x2={0} y2={s} stroke={look.colour} strokeWidth={look.hatch?.width ?? 1} />
      </pattern>
    </defs>
  );
}

/** A swatch drawn with the mark's own screen style (colour, width, dash, fill, hatch). */
function Swatch({ kind }: { kind: MarkKind }) {
  const look: ScreenLook = BOUNDARY_STYLES[kind].screen;
  const stroke = { stroke: look.colour, strokeWidth: look.width, strokeOpacity: look.strokeOpacity, strokeDasharray: look.dash, fill: 'none' };
  let body: ReactNode;
  switch (kind) {
    case 'armBase':
      body = (
        <>
          <circle cx={8} cy={H / 2} r={4.5} {...stroke} fill="var(--color-paper-raised, #fff)" />
          <line x1={12.5} y1={H / 2} x2={W - 2} y2={H / 2} {...stroke} />
        </>
      );
      break;
    case 'fence':
      body = <line x1={2} y1={H / 2} x2={W - 2} y2={H / 2} {...stroke} />;
      break;
    case 'opening':
      body = (
        <>
          <line x1={1} y1={H / 2} x2={W - 1} y2={H / 2} stroke={BOUNDARY_STYLES.fence.screen.colour} strokeWidth={BOUNDARY_STYLES.fence.screen.width} />
          <line x1={7} y1={H / 2} x2={W - 7} y2={H / 2} stroke={look.gap?.colour} strokeWidth={look.gap?.width} />
          <line x1={7} y1={2} x2={7} y2={H - 2} {...stroke} />
          <line x1={W - 7} y1={2} x2={W - 7} y2={H - 2} {...stroke} />
        </>
      );
      break;
    case 'pointReached':
    case 'pointUnreached':
      body = <path d={`M${W / 2 - 4},${H / 2 - 4}L${W / 2 + 4},${H / 2 + 4}M${W / 2 - 4},${H / 2 + 4}L${W / 2 + 4},${H / 2 - 4}`} {...stroke} strokeDasharray={undefined} />;
      break;
    case 'shared':
    case 'keepout':
      body = (
        <>
          <Hatch id={`key-hatch-${kind}`} look={look} />
          <rect x={1.5} y={1.5} width={W - 3} height={H - 3} {...stroke} fill={`url(#key-hatch-${kind})`} />
        </>
      );
      break;
    default:
      body = <rect x={1.5} y={1.5} width={W - 3} height={H - 3} {...stroke} fill={look.fill ?? 'none'} fillOpacity={look.fillOpacity} />;
  }
  return (
    <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} aria-hidden className="shrink-0" data-key-swatch={kind}>
      {body}
    </svg>
  );
}

function RoleSwatch({ style }: { style: LayerStyle }) {
  return (
    <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} aria-hidden className="shrink-0">
      <rect x={1.5} y={1.5} width={W - 3} height={H - 3} stroke={style.stroke} strokeWidth={style.strokeWidth} fill={style.fill ?? 'none'} fillOpacity={style.fillOpacity} opacity={style.opacity} />
    </svg>
  );
}

/**
 * The editor plan's key (legend): every fill, outline and hatch the plan draws, the floor plan's
 * layer roles when there is a floor plan, and the reference direction. A disclosure, closed at
 * first, so it takes no room until asked for; Enter or Space on "Key" opens it.
 */
export function PlanKey({ withFloor, className }: { withFloor: boolean; className?: string }) {
  return (
    <details className={cn('group rounded-control border border-rule bg-paper-raised/95 text-xs shadow-sm', className)} data-plan-key>
      <summary className="cursor-pointer px-2 py-1 font-bold select-none">Key</summary>
      <ul aria-label="Key to the plan" className="flex max-h-80 flex-col gap-1 overflow-y-auto px-2 pb-2">
        {KEY_ROWS.map((r) => (
          <li key={r.kind} className="flex items-center gap-2">
            <Swatch kind={r.kind} />
            <span>{r.text}</span>
          </li>
        ))}
        {withFloor &&
          FLOOR_ROLES.map((role) => (
            <li key={role} className="flex items-center gap-2">
              <RoleSwatch style={ROLE_STYLE[role]} />
              <span>{ROLE_LABEL[role].label} (floor plan)</span>
            </li>
          ))}
        <li className="flex items-center gap-2">
          <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} aria-hidden className="shrink-0">
            <path d={`M${W / 2},1L${W / 2 + 4},${H - 1}L${W / 2},${H - 4}L${W / 2 - 4},${H - 1}Z`} fill="var(--color-ink, #1c2230)" />
          </svg>
          <span>{PLAN_NORTH.label} is up</span>
        </li>
      </ul>
    </details>
  );
}
