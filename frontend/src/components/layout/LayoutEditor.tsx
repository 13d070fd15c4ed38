import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { applyFenceProposal, checkedFloorOf } from '@shared/analysis';
import type { Finding } from '@shared/analysis';
import { padBounds, pointsBounds } from '@shared/geometry';
import type { LayoutContent, LayoutDto } from '@shared/schemas/layout';
import type { ArmModelDto } from '../../api/armModels';
import type { FenceProposalDto } from '../../api/fenceProposals';
import type { FloorPlanDto } from '../../api/floorPlans';
import { useCreateLayout } from '../../api/layouts';
import { commandForKey } from '../../editor/editorKeys';
import { addArm, addWorkPoint, addBoundary, duplicateArm, moveArm, moveBoundaryVertex, nudgeArm, removeArm, removeBoundary, rotateArm, roundMm, setArmYaw } from '../../editor/layoutEdits';
import { useAnalysisWorker, type FirstView } from '../../editor/useAnalysisWorker';
import { placeAtCandidate } from '../../editor/placementEdits';
import { usePlacementWorker } from '../../editor/usePlacementWorker';
import { cellReasonText } from '@shared/analysis';
import { useLayoutEditor } from '../../editor/useLayoutEditor';
import { PlanView } from '../../plan/PlanView';
import type { PlanCanvas } from '../../plan/planTypes';
import { screenToPlan, type PlanBounds } from '../../plan/viewTransform';
import { layerStylesFor } from '../floorPlan/layerRoles';
import { PlanSheetDialog } from '../planSheet/PlanSheetDialog';
import { ArmInspector } from './ArmInspector';
import { ConflictDialog } from './ConflictDialog';
import { EditorToolbar } from './EditorToolbar';
import { FindingsPanel } from './FindingsPanel';
import { GuardRingPanel } from './GuardRingPanel';
import { drawGuardRingPreview, GUARD_RING_PREVIEW } from './guardRingPreview';
import { LayoutPanels } from './LayoutPanels';
import { SectionView } from './SectionView';
import { PlacementPanel } from './PlacementPanel';
import { cellAt, drawPlacementMap, drawPlacementMarks } from './placementMapDraw';
import { createLayoutScene, type EditorTool, type LayoutScene, type ShapeTool } from './layoutScene';
import type { LayoutSelection } from './panelTypes';
import { WorkHeightsEditor } from './WorkHeightsEditor';
import { BoundaryInspector } from './BoundaryInspector';
import { PlanKey } from './PlanKey';

export interface LayoutEditorProps {
  layout: LayoutDto;
  floorPlan: FloorPlanDto | null;
  armModels: ArmModelDto[];
  /** Reviewers: no drag, no tools, the same findings. */
  readOnly: boolean;
  /** The server's analysis of the content as loaded, shown until the worker's first result (null: wait for the worker). */
  firstView?: FirstView | null;
}

const BOUNDARY_WORD = { fence: 'fence', keepout: 'keep-out', operator: 'operator area', opening: 'opening' } as const;
/** Height a new fence gets until the planner types its own, mm (a common guard height). */
const NEW_FENCE_HEIGHT_MM = 2000;
const NO_HIGHLIGHT: ReadonlySet<string> = new Set();

const isEditable = (t: EventTarget | null) => t instanceof HTMLElement && (t.isContentEditable || /^(INPUT|TEXTAREA|SELECT)$/.test(t.tagName));

/** Plan bounds of a finding: its geometry's box, or 5 m around its spot. */
function findingBounds(f: Finding): PlanBounds | null {
  const pad = 1500;
  if (f.geometry) {
    const rings = f.geometry.type === 'Polygon' ? f.geometry.coordinates : f.geometry.coordinates.flat();
    const b = pointsBounds(rings.flat());
    if (b) return padBounds(b, pad);
  }
  if (f.at) return { minX: f.at[0] - 2500, minY: f.at[1] - 2500, maxX: f.at[0] + 2500, maxY: f.at[1] + 2500 };
  return null;
}

/** The layout editor: plan with arms, reach and boundaries, tools, inspector, live findings from the worker. */
export function LayoutEditor({ layout, floorPlan, armModels, readOnly: viewOnly, firstView = null }: LayoutEditorProps) {
  const ed = useLayoutEditor(layout);
  const { content, edit } = ed;
  const conflict = ed.save.kind === 'conflict';
  const readOnly = viewOnly || conflict;
  const [selection, setSelection] = useState<LayoutSelection | null>(null);
  const [tool, setTool] = useState<EditorTool>('select');
  const [hint, setHint] = useState<string | null>(null);
  const [bandHeight, setBandHeight] = useState<number | null>(layout.content.workHeights[0] ?? null);
  const [focusHeightOf, setFocusHeightOf] = useState<string | null>(null);
  const [conflictOpen, setConflictOpen] = useState(true);
  const [canvas, setCanvas] = useState<PlanCanvas | null>(null);
  const [sectionLine, setSectionLine] = useState<[[number, number], [number, number]] | null>(null);
  const [ringOpen, setRingOpen] = useState(false);
  const [ringProposal, setRingProposal] = useState<FenceProposalDto | null>(null);
  const scene = useRef<LayoutScene | null>(null);
  const contentRef = useRef(content);
  useLayoutEffect(() => {
    contentRef.current = content;
  }, [content]);
  const navigate = useNavigate();
  const createLayout = useCreateLayout(layout.projectId);

  const models = useMemo(() => armModels.map((m) => ({ id: m.id, params: m.params })), [armModels]);
  const floor = useMemo(
    () => (floorPlan ? { geometry: floorPlan.geometry, layers: floorPlan.layers.map((l) => ({ name: l.name, role: l.role, height: l.height })) } : null),
    [floorPlan],
  );
  const checkedFloor = useMemo(() => checkedFloorOf(floorPlan?.layers), [floorPlan]);
  const live = useAnalysisWorker({ models, floor, content, sectionLine, firstView });
  const placing = usePlacementWorker();
  const [placeOpen, setPlaceOpen] = useState(false);
  const [placeHover, setPlaceHover] = useState<string | null>(null);
  // What the last search was for, so a candidate can be placed as the search meant it.
  const [placeFor, setPlaceFor] = useState<{ armId?: string; armModelId: number; mountHeight: number; restrict?: { j1Min: number; j1Max: number } } | null>(null);
  const findings = live.view?.analysis.findings ?? null;
  // The tables under the plan (work points, coverage, shared zones) follow the analysis once a drag
  // ends: redrawing tens of thousands of rows for every pose of a drag would hold up the plan.
  const liveAnalysis = live.view?.analysis ?? null;
  const [panelAnalysis, setPanelAnalysis] = useState(liveAnalysis);
  if (!live.view?.dragging && panelAnalysis !== liveAnalysis) setPanelAnalysis(liveAnalysis);
  const selectedFinding = selection?.kind === 'finding' ? (findings?.find((f) => f.id === selection.id) ?? null) : null;
  const highlightArms = useMemo(() => (selectedFinding ? new Set(selectedFinding.arms) : NO_HIGHLIGHT), [selectedFinding]);

  const styles = useMemo(() => (floorPlan ? layerStylesFor(floorPlan.layers, new Set()) : {}), [floorPlan]);
  // Without a floor plan the view fits the arms as they stand when the editor opens; later arm
  // moves must not refit the view.
  const [armsBounds] = useState(() => {
    const b = pointsBounds(content.arms.map((a) => [a.x, a.y]));
    return b ? padBounds(b, 3000) : { minX: -5000, minY: -5000, maxX: 5000, maxY: 5000 };
  });
  const bounds = floorPlan ? floorPlan.bounds : armsBounds;

  // The latest callbacks for the scene, which is created once per canvas.
  const handlers = useRef({
    onArmMoved: (id: string, x: number, y: number) => edit(moveArm(contentRef.current, id, x, y), `Move ${id}`, `drag:${id}`),
    onArmTurned: (id: string, yaw: number) => edit(setArmYaw(contentRef.current, id, yaw), `Turn ${id}`, `turn:${id}`),
    onVertexMoved: (boundaryId: string, index: number, to: [number, number]) =>
      edit(moveBoundaryVertex(contentRef.current, boundaryId, index, to), `Move corner of ${boundaryId}`, `vertex:${boundaryId}:${index}`),
    onPointPlaced: (at: [number, number]) => {
      const z = contentRef.current.workHeights[0] ?? 0;
      const r = addWorkPoint(contentRef.current, at, z);
      edit(r.content, `Add work point ${r.id}`);
      setSelection({ kind: 'point', id: r.id });
      setHint(`Work point ${r.id} added at z = ${z} mm; edit it in the Work points tab.`);
    },
    onShapeDrawn: (kind: ShapeTool, points: Array<[number, number]>) => {
      try {
        const r = addBoundary(contentRef.current, kind, points, kind === 'fence' ? { height: NEW_FENCE_HEIGHT_MM } : {});
        edit(r.content, `Draw ${BOUNDARY_WORD[kind]} ${r.id}`);
        setSelection({ kind: 'boundary', id: r.id });
        if (kind === 'fence') {
          setFocusHeightOf(r.id);
          setTool('select');
          setHint(`Fence ${r.id} drawn at ${NEW_FENCE_HEIGHT_MM} mm: type its real height in the inspector.`);
        }
      } catch (err) {
        setHint(err instanceof Error ? err.message.replace(/^\w+: /, '') : String(err));
      }
    },
  });
  const postDrag = live.postDrag;

  useEffect(() => {
    if (!canvas) return;
    const s = createLayoutScene(canvas, canvas.svg, {
      onSelect: (sel) => setSelection(sel),
      onDragPose: (pose) => postDrag(pose),
      onArmMoved: (...a) => handlers.current.onArmMoved(...a),
      onArmTurned: (...a) => handlers.current.onArmTurned(...a),
      onVertexMoved: (...a) => handlers.current.onVertexMoved(...a),
      onShapeDrawn: (...a) => handlers.current.onShapeDrawn(...a),
      onPointPlaced: (p) => handlers.current.onPointPlaced(p),
      onSectionDrawn: (line) => {
        setSectionLine(line);
        setTool('select');
        setHint('Section drawn: the side view is below the plan. Drag an arm to see its cut follow; S draws a new line.');
      },
      onHint: (t) => setHint(t),
    });
    scene.current = s;
    return () => {
      s.destroy();
      scene.current = null;
    };
  }, [canvas, postDrag]);

  useEffect(() => {
    scene.current?.update({
      content,
      view: live.view,
      selection,
      highlightArms,
      findingGeometry: selectedFinding?.geometry ?? null,
      tool: readOnly && tool !== 'section' ? 'select' : tool,
      bandHeight,
      readOnly,
      sectionLine,
    });
  }, [canvas, content, live.view, selection, highlightArms, selectedFinding, tool, bandHeight, readOnly, sectionLine]);

  // The proposed guard ring, drawn dashed over the plan until it is accepted or discarded.
  useEffect(() => {
    if (!canvas) return;
    canvas.setOverlay(GUARD_RING_PREVIEW.name, (l) => drawGuardRingPreview(l, ringProposal, ringProposal?.system.postWidthMm ?? 0), GUARD_RING_PREVIEW);
    return () => canvas.removeOverlay(GUARD_RING_PREVIEW.name);
  }, [canvas, ringProposal]);

  const placeCandidate = useCallback(
    (index: number) => {
      const c = placing.result?.candidates[index];
      if (!c || !placeFor || readOnly) return;
      const r = placeAtCandidate(contentRef.current, c, placeFor.armId ? { armId: placeFor.armId } : { armModelId: placeFor.armModelId, mountHeight: placeFor.mountHeight, restrict: placeFor.restrict });
      edit(r.content, placeFor.armId ? `Move ${r.id} to candidate ${index + 1}` : `Place ${r.id} at candidate ${index + 1}`);
      setSelection({ kind: 'arm', id: r.id });
      setHint(`${r.id} placed at candidate ${index + 1} (worst margin ${c.worstMarginMm.toFixed(0)} mm); undo puts it back.`);
    },
    [placing.result, placeFor, readOnly, edit],
  );

  useEffect(() => {
    if (!canvas) return;
    const shown = placeOpen ? placing.map?.map ?? null : null;
    const proposed = placeOpen && placing.proposal ? placing.proposal.content.arms.map((a) => ({ id: a.id, x: a.x, y: a.y })) : [];
    drawPlacementMap(canvas, shown);
    const marks = placeOpen ? { candidates: placing.result?.candidates ?? [], proposed, onPick: placeCandidate } : null;
    drawPlacementMarks(canvas, marks);
    return canvas.onView(() => drawPlacementMarks(canvas, marks));
  }, [canvas, placeOpen, placing.map, placing.result, placing.proposal, placeCandidate]);

  // A finished search shows its map whole (with 1.5 m around it).
  useEffect(() => {
    const m = placing.result?.map;
    if (!canvas || !m || m.cols === 0) return;
    canvas.fit({ minX: m.origin[0] - 1500, minY: m.origin[1] - 1500, maxX: m.origin[0] + m.cols * m.gridMm + 1500, maxY: m.origin[1] + m.rows * m.gridMm + 1500 }, { animate: true });
  }, [canvas, placing.result]);

  useEffect(() => {
    const m = placeOpen ? placing.map : null;
    if (!canvas || !m) return;
    const onMove = (e: PointerEvent) => {
      const pt = canvas.view().toPlan(e.clientX, e.clientY);
      const k = cellAt(m.map, pt.x, pt.y);
      if (k < 0) return setPlaceHover(null);
      const why = cellReasonText(m.map, m.names, k);
      setPlaceHover(why ?? `worst margin ${m.map.worstMarginMm[k].toFixed(0)} mm at yaw ${m.map.yawDeg[k]}°`);
    };
    canvas.svg.addEventListener('pointermove', onMove);
    return () => canvas.svg.removeEventListener('pointermove', onMove);
  }, [canvas, placeOpen, placing.map]);

  const selectedArm = selection?.kind === 'arm' ? content.arms.find((a) => a.id === selection.id) : undefined;
  const selectedBoundary = selection?.kind === 'boundary' ? content.boundaries.find((z) => z.id === selection.id) : undefined;

  const onAddArm = useCallback(
    (modelId: number) => {
      const c = canvas?.view();
      const centre = c && c.width > 0 ? screenToPlan(c.transform, c.width / 2, c.height / 2) : { x: 0, y: 0 };
      const r = addArm(contentRef.current, modelId, [roundMm(centre.x), roundMm(centre.y)]);
      edit(r.content, `Add ${r.id}`);
      setSelection({ kind: 'arm', id: r.id });
      setTool('select');
    },
    [canvas, edit],
  );

  // Keys: captured before the plan's own keys (which pan with the arrows when nothing is selected).
  useEffect(() => {
    function onKey(e: KeyboardEvent) {
      if (isEditable(e.target) || document.querySelector('dialog[open]')) return;
      const cmd = commandForKey(e, { armSelected: !!selectedArm && !readOnly, boundarySelected: !!selectedBoundary && !readOnly, drawing: tool !== 'select' && !readOnly });
      if (!cmd) return;
      const c = contentRef.current;
      switch (cmd.kind) {
        case 'undo':
          if (readOnly) return;
          ed.undo();
          break;
        case 'redo':
          if (readOnly) return;
          ed.redo();
          break;
        case 'nudge':
          edit(nudgeArm(c, selectedArm!.id, cmd.dx, cmd.dy), `Move ${selectedArm!.id}`, `nudge:${selectedArm!.id}`);
          break;
        case 'rotate':
          edit(rotateArm(c, selectedArm!.id, cmd.delta), `Turn ${selectedArm!.id}`, `turn:${selectedArm!.id}`);
          break;
        case 'duplicate': {
          const r = duplicateArm(c, selectedArm!.id);
          edit(r.content, `Duplicate ${selectedArm!.id}`);
          setSelection({ kind: 'arm', id: r.id });
          break;
        }
        case 'delete':
          if (selectedArm) edit(removeArm(c, selectedArm.id), `Remove ${selectedArm.id}`);
          else if (selectedBoundary) edit(removeBoundary(c, selectedBoundary.id), `Remove ${selectedBoundary.id}`);
          setSelection(null);
          break;
        case 'finish':
          scene.current?.finishDraw();
          break;
        case 'section-tool':
          setTool('section');
          setSelection(null);
          break;
        case 'cancel':
          if (scene.current?.isDrawing()) scene.current.cancelDraw();
          else if (tool !== 'select') setTool('select');
          else setSelection(null);
          break;
      }
      e.preventDefault();
    }
    document.addEventListener('keydown', onKey, true);
    return () => document.removeEventListener('keydown', onKey, true);
  }, [ed, edit, readOnly, selectedArm, selectedBoundary, tool]);

  // Stable, so the findings list's rows that did not change are not drawn again.
  const pickFinding = useCallback(
    (f: Finding) => {
      setSelection({ kind: 'finding', id: f.id });
      const b = findingBounds(f);
      if (b && canvas) canvas.fit(b, { animate: true });
    },
    [canvas],
  );

  async function keepMineAsCopy() {
    const copy = await createLayout.mutateAsync({ name: `${layout.name} (my copy)`.slice(0, 160), floorPlanId: layout.floorPlanId, content: contentRef.current });
    await navigate(`/projects/${layout.projectId}/layouts/${copy.id}`);
  }

  const panelEdit = useCallback((next: LayoutContent, label: string) => edit(next, label), [edit]);
  const modelList = useMemo(() => armModels.map((m) => ({ id: m.id, name: m.name, maxReach: m.maxReach })), [armModels]);
  const undoLabel = ed.history.label;
  const [sheetOpen, setSheetOpen] = useState(false);
  const redoLabel = ed.history.future[0]?.label ?? '';

  return (
    <div className="flex flex-col gap-3" data-layout-editor data-read-only={readOnly ? 'true' : 'false'}>
      <EditorToolbar
        readOnly={readOnly}
        tool={tool}
        onTool={(t) => {
          setTool(t);
          if (t !== 'select') setSelection(null);
        }}
        armModels={modelList}
        onAddArm={onAddArm}
        canUndo={ed.canUndo}
        canRedo={ed.canRedo}
        undoLabel={undoLabel}
        redoLabel={redoLabel}
        onUndo={ed.undo}
        onRedo={ed.redo}
        save={ed.save}
        onRetrySave={() => void ed.saveNow()}
        onExportSheet={() => setSheetOpen(true)}
        onProposeGuardRing={() => {
          setRingOpen(true);
          setSelection(null);
        }}
        onFindPlace={() => setPlaceOpen(true)}
      />
      <PlanSheetDialog open={sheetOpen} onClose={() => setSheetOpen(false)} layoutId={layout.id} layoutName={layout.name} />
      <div className="rounded-control border border-rule bg-paper-raised px-3 py-2">
        <WorkHeightsEditor content={content} readOnly={readOnly} onEdit={edit} bandHeight={bandHeight} onBandHeight={setBandHeight} />
      </div>
      <div className="grid h-[min(74vh,48rem)] min-h-[30rem] grid-cols-[minmax(0,1fr)_23rem] gap-3">
        <div className="flex min-h-0 min-w-0 flex-col gap-1">
          <PlanView
            geometry={floorPlan?.geometry ?? null}
            layerStyles={styles}
            bounds={bounds}
            onCanvas={setCanvas}
            label={`Layout ${layout.name}`}
            className="min-h-0 flex-1"
            overlay={<PlanKey withFloor={floorPlan !== null} className="absolute top-11 left-2 max-w-72" />}
          />
          <p className="min-h-5 text-xs text-ink-muted" aria-live="polite" data-hint>
            {hint ?? (readOnly ? '' : tool === 'select' ? 'Click an arm to select it; drag to move it, drag its round handle to turn it.' : '')}
          </p>
        </div>
        <aside className="flex min-h-0 flex-col gap-3" aria-label="Inspector and findings">
          {ringOpen && !readOnly && (
            <div className="max-h-[70%] shrink-0 overflow-y-auto rounded-control border border-rule bg-paper-raised p-3">
              <GuardRingPanel
                layoutId={layout.id}
                layoutName={layout.name}
                content={content}
                proposal={ringProposal}
                onProposal={setRingProposal}
                onAccept={(p) => {
                  edit({ ...contentRef.current, boundaries: applyFenceProposal(contentRef.current.boundaries, p) }, `Accept guard ring (${p.boundaries.filter((z) => z.kind === 'fence').length} fences)`);
                  setRingProposal(null);
                  setRingOpen(false);
                  setHint('Guard ring accepted as fences and doors; undo takes it back in one step.');
                }}
                onClose={() => {
                  setRingProposal(null);
                  setRingOpen(false);
                }}
              />
            </div>
          )}
          {placeOpen && (
            <div className="max-h-[70%] shrink-0 overflow-y-auto">
              <PlacementPanel
                content={content}
                armModels={modelList}
                selectedPointId={selection?.kind === 'point' ? selection.id : null}
                work={placing}
                hover={placeHover}
                readOnly={readOnly}
                onSearch={(request) => {
                  setPlaceFor({ armId: request.armId, armModelId: request.armModelId, mountHeight: request.mountHeightMm, restrict: request.restrict });
                  placing.search(request, { content: contentRef.current, models, floor });
                }}
                onPropose={(request) => placing.propose(request, { content: contentRef.current, models, floor })}
                onPlace={placeCandidate}
                onAcceptProposal={() => {
                  if (!placing.proposal) return;
                  edit(placing.proposal.content, `Take the proposed cell layout (${placing.proposal.content.arms.length} arms)`);
                  placing.clear();
                }}
                onClose={() => {
                  placing.cancel();
                  setPlaceOpen(false);
                  setPlaceHover(null);
                }}
              />
            </div>
          )}
          {!ringOpen && !placeOpen && (selectedArm || selectedBoundary) && (
            <div className="max-h-[55%] shrink-0 overflow-y-auto rounded-control border border-rule bg-paper-raised p-3">
              {selectedArm ? (
                <ArmInspector arm={selectedArm} content={content} armModels={modelList} readOnly={readOnly} onEdit={edit} onSelectArm={(id) => setSelection(id ? { kind: 'arm', id } : null)} />
              ) : (
                <BoundaryInspector boundary={selectedBoundary!} content={content} readOnly={readOnly} focusHeight={focusHeightOf === selectedBoundary!.id} onEdit={edit} onDeselect={() => setSelection(null)} />
              )}
            </div>
          )}
          <div className="flex min-h-0 flex-1 flex-col">
            <FindingsPanel findings={findings} content={content} floor={checkedFloor} selectedId={selectedFinding?.id ?? null} onPick={pickFinding} busy={live.busy} error={live.error} timingMs={live.view?.analysis.timingMs ?? null} />
          </div>
        </aside>
      </div>
      <SectionView section={sectionLine ? (live.view?.section ?? null) : null} hasLine={sectionLine !== null} arms={content.arms} busy={live.busy} onClear={() => setSectionLine(null)} />
      <LayoutPanels
        layoutName={layout.name}
        content={content}
        analysis={panelAnalysis}
        armModels={modelList}
        readOnly={readOnly}
        onEdit={panelEdit}
        onSelect={setSelection}
        selected={selection}
      />
      <ConflictDialog
        open={conflict && conflictOpen}
        onClose={() => setConflictOpen(false)}
        onReloadTheirs={async () => {
          await ed.reloadFromServer();
          setConflictOpen(true);
        }}
        onKeepMineAsCopy={keepMineAsCopy}
      />
    </div>
  );
}
