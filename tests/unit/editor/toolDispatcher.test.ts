// The editor's tools driven through the dispatcher with stand-in pointer events (no DOM): which tool
// gets a gesture, what it commits on release, and what a cancel leaves. Plan mm = event px here.
import { describe, expect, it } from 'vitest';
import type { ArmPlacement, LayoutContent, Boundary } from '@shared/schemas/layout';
import type { EditorTool, SceneCallbacks, SceneState } from '../../../frontend/src/components/layout/sceneTypes';
import type { HeldEdit, ToolHost } from '../../../frontend/src/components/layout/tools/tool';
import { ToolDispatcher } from '../../../frontend/src/components/layout/tools/toolDispatcher';

const arm: ArmPlacement = { id: 'R1', armModelId: 1, label: '', x: 1000, y: 2000, yaw: 0, mountHeight: 0 };
const fence = { id: 'F1', kind: 'fence', label: '', points: [[0, 0], [4000, 0]], height: 1400 } as Boundary;
const content: LayoutContent = { arms: [arm], workPoints: [], boundaries: [fence], workHeights: [900] };

function setup(tool: EditorTool = 'select', readOnly = false) {
  const calls: Array<[string, ...unknown[]]> = [];
  const record = (name: string) => (...args: unknown[]) => void calls.push([name, ...args]);
  const cb: SceneCallbacks = {
    onSelect: record('select'),
    onDragPose: record('pose'),
    onArmMoved: record('moved'),
    onArmTurned: record('turned'),
    onVertexMoved: record('vertex'),
    onShapeDrawn: record('shape'),
    onPointPlaced: record('point'),
    onSectionDrawn: record('section'),
    onHint: record('hint'),
  };
  const state: SceneState = { content, view: null, selection: null, highlightArms: new Set(), findingGeometry: null, tool, bandHeight: null, readOnly };
  const held: HeldEdit[] = [];
  const host: ToolHost = { state: () => state, cb, hold: (h) => void held.push(h), redrawArm() {}, redrawMarks() {}, redrawDraft() {}, redrawAll() {} };
  const tools = new ToolDispatcher(host, (e) => ({ plan: [e.clientX, e.clientY], k: 1, boundaryId: null }));
  const el = { setPointerCapture() {}, releasePointerCapture() {} } as unknown as Element;
  const ev = (x: number, y: number, o: { handle?: boolean; type?: string } = {}) =>
    ({
      clientX: x,
      clientY: y,
      button: 0,
      pointerId: 1,
      type: o.type ?? 'pointermove',
      target: { classList: { contains: (c: string) => !!o.handle && c === 'turn-handle' }, closest: () => null },
      stopPropagation() {},
      preventDefault() {},
    }) as unknown as PointerEvent;
  const names = () => calls.map((c) => c[0]);
  return { tools, calls, held, state, el, ev, names };
}

describe('tool dispatcher', () => {
  it('moves an arm by its grab point and commits once, on release', () => {
    const t = setup();
    t.tools.pressArm(t.ev(1010, 2005), t.el, arm);
    t.tools.pointerMove(t.ev(1510, 2105));
    t.tools.pointerMove(t.ev(2010, 2205));
    expect(t.tools.dragPose()).toEqual({ armId: 'R1', x: 2000, y: 2200, yaw: 0 });
    t.tools.pointerUp(t.ev(2010, 2205, { type: 'pointerup' }));
    expect(t.names()).toEqual(['select', 'pose', 'pose', 'moved']);
    expect(t.calls.at(-1)).toEqual(['moved', 'R1', 2000, 2200]);
    expect(t.held).toEqual([{ pose: { armId: 'R1', x: 2000, y: 2200, yaw: 0 } }]);
    expect(t.tools.dragPose()).toBeNull();
  });

  it('turns an arm from its handle to face the pointer, even while a drawing tool is chosen', () => {
    const t = setup('fence');
    t.tools.pressArm(t.ev(1034, 2000, { handle: true }), t.el, arm);
    t.tools.pointerMove(t.ev(1000, 2500));
    t.tools.pointerUp(t.ev(1000, 2500, { type: 'pointerup' }));
    expect(t.calls.at(-1)).toEqual(['turned', 'R1', 90]);
    // The arm's body does not start a drag under a drawing tool.
    const u = setup('fence');
    u.tools.pressArm(u.ev(1000, 2000), u.el, arm);
    u.tools.pointerMove(u.ev(1500, 2000));
    expect(u.names()).toEqual([]);
  });

  it('commits nothing for a press without a move, or a cancelled drag', () => {
    const t = setup();
    t.tools.pressArm(t.ev(1000, 2000), t.el, arm);
    t.tools.pointerUp(t.ev(1000, 2000, { type: 'pointerup' }));
    t.tools.pressArm(t.ev(1000, 2000), t.el, arm);
    t.tools.pointerMove(t.ev(3000, 3000));
    t.tools.pointerCancel(t.ev(3000, 3000, { type: 'pointercancel' }));
    expect(t.names()).toEqual(['select', 'pose', 'select', 'pose', 'pose']);
    expect(t.calls.filter((c) => c[0] === 'pose').at(-1)).toEqual(['pose', null]);
    expect(t.held).toEqual([]);
  });

  it('on a read-only layout selects but does not drag, and the press’s own click does not deselect', () => {
    const t = setup('select', true);
    t.tools.pressArm(t.ev(1000, 2000), t.el, arm);
    t.tools.pointerMove(t.ev(1500, 2500));
    t.tools.click(t.ev(1500, 2500, { type: 'click' }));
    expect(t.names()).toEqual(['select']);
    t.tools.click(t.ev(1500, 2500, { type: 'click' }));
    expect(t.calls.at(-1)).toEqual(['select', null]);
  });

  it('drags a boundary corner and commits it on release', () => {
    const t = setup();
    t.tools.pressVertex(t.ev(4000, 0), t.el, { boundaryId: 'F1', index: 1, at: [4000, 0] });
    expect(t.tools.dragVertexAt()).toBeNull();
    t.tools.pointerMove(t.ev(4200.04, 300));
    expect(t.tools.dragVertexAt()).toEqual({ boundaryId: 'F1', index: 1, at: [4200, 300] });
    t.tools.pointerUp(t.ev(4200.04, 300, { type: 'pointerup' }));
    expect(t.calls).toEqual([['vertex', 'F1', 1, [4200, 300]]]);
  });

  it('draws a fence by clicks; a double-click finishes it, its echo click adds no corner', () => {
    const t = setup('fence');
    t.tools.toolChanged(null);
    t.tools.click(t.ev(0, 0, { type: 'click' }));
    t.tools.click(t.ev(3000, 0, { type: 'click' }));
    t.tools.click(t.ev(3000.5, 0, { type: 'click' }));
    t.tools.pointerMove(t.ev(3000, 500));
    expect(t.tools.draft()).toEqual({ points: [[0, 0], [3000, 0]], cursor: [3000, 500], closed: false });
    t.tools.dblClick(t.ev(3000, 0, { type: 'dblclick' }));
    expect(t.calls.find((c) => c[0] === 'shape')).toEqual(['shape', 'fence', [[0, 0], [3000, 0]]]);
    expect(t.tools.isDrawing()).toBe(false);
  });

  it('asks for more corners when an area is finished too early, and drops the shape on a tool change', () => {
    const t = setup('operator');
    t.tools.click(t.ev(0, 0, { type: 'click' }));
    t.tools.click(t.ev(1000, 0, { type: 'click' }));
    t.tools.finishDraw();
    expect(t.calls.at(-1)).toEqual(['hint', 'Needs at least 3 points; keep clicking, or Esc to cancel.']);
    expect(t.tools.isDrawing()).toBe(true);
    t.state.tool = 'select';
    t.tools.toolChanged('operator');
    t.state.tool = 'operator';
    expect(t.tools.isDrawing()).toBe(false);
  });

  it('cuts an opening into a fence by two clicks, and refuses a click off the fence', () => {
    const t = setup('opening');
    t.tools.click(t.ev(1000, 500, { type: 'click' }));
    expect(t.calls.at(-1)).toEqual(['hint', 'That is not on a fence: click on the fence line.']);
    t.tools.click(t.ev(1000, 10, { type: 'click' }));
    t.tools.dblClick(t.ev(1000, 10, { type: 'dblclick' }));
    t.tools.click(t.ev(1900, -12, { type: 'click' }));
    expect(t.calls.filter((c) => c[0] === 'shape')).toEqual([['shape', 'opening', [[1000, 0], [1900, 0]]]]);
  });

  it('places a work point where the point tool clicks; a click in select clears the selection', () => {
    const t = setup('point');
    t.tools.click(t.ev(123.44, 456.66, { type: 'click' }));
    expect(t.calls).toEqual([['point', [123.4, 456.7]]]);
    const s = setup('select');
    s.tools.click(s.ev(0, 0, { type: 'click' }));
    expect(s.calls).toEqual([['select', null]]);
  });

  it('draws a section line by two clicks; the pointer is followed in between, Esc drops it, a slip is ignored', () => {
    const t = setup('section');
    t.tools.click(t.ev(100, 200, { type: 'click' }));
    expect(t.tools.isDrawing()).toBe(true);
    t.tools.pointerMove(t.ev(900, 250));
    expect(t.tools.sectionDraft()).toEqual({ start: [100, 200], cursor: [900, 250] });
    t.tools.click(t.ev(103, 202, { type: 'click' })); // closer than MIN_SECTION_PX: a slip
    expect(t.tools.isDrawing()).toBe(true);
    t.tools.click(t.ev(3000.04, 250, { type: 'click' }));
    expect(t.calls.filter((c) => c[0] === 'section')).toEqual([['section', [[100, 200], [3000, 250]]]]);
    expect(t.tools.isDrawing()).toBe(false);
    t.tools.click(t.ev(0, 0, { type: 'click' }));
    t.tools.cancelDraw();
    expect(t.tools.sectionDraft()).toBeNull();
    expect(t.calls.filter((c) => c[0] === 'section')).toHaveLength(1);
  });
});
