import { useState } from 'react';
import type { SaveState } from '../../editor/useLayoutEditor';
import { KEY_HELP } from '../../editor/editorKeys';
import { cn } from '../../lib/cn';
import { Button } from '../Button';
import type { EditorTool } from './layoutScene';

const TOOLS: ReadonlyArray<{ tool: EditorTool; text: string; title: string }> = [
  { tool: 'select', text: 'Select', title: 'Select and drag arms and boundary corners' },
  { tool: 'point', text: 'Work point', title: 'Click the plan to add a work point at the first work height' },
  { tool: 'fence', text: 'Fence', title: 'Draw a guard fence: click its corners, Enter or double-click to finish' },
  { tool: 'opening', text: 'Opening', title: 'Cut an access opening: two clicks on a fence' },
  { tool: 'keepout', text: 'Keep-out', title: 'Draw a keep-out area: click at least 3 corners' },
  { tool: 'operator', text: 'Operator area', title: 'Draw an area where people work: click at least 3 corners' },
  { tool: 'section', text: 'Section', title: 'Draw a section line (S): click its start A and end A′; the side view appears below the plan' },
];


/** The one tool a read-only layout offers: a section line is a view, not an edit. */
const SECTION_TOOL = TOOLS.find((t) => t.tool === 'section')!;
export interface EditorToolbarProps {
  readOnly: boolean;
  tool: EditorTool;
  onTool(t: EditorTool): void;
  armModels: Array<{ id: number; name: string }>;
  onAddArm(modelId: number): void;
  canUndo: boolean;
  canRedo: boolean;
  undoLabel: string;
  redoLabel: string;
  onUndo(): void;
  onRedo(): void;
  save: SaveState;
  onRetrySave(): void;
  /** Opens the plan sheet export (shown to everyone who may read the layout). */
  onExportSheet?(): void;
  /** Opens the guard-ring proposal (editors only). */
  onProposeGuardRing?(): void;
  /** Opens the placement search ("Find a place"). */
  onFindPlace?(): void;
}

/** The row above the plan: add arm, drawing tools, undo/redo, save state, key help. */
export function EditorToolbar(p: EditorToolbarProps) {
  const [modelId, setModelId] = useState<string>('');
  const [help, setHelp] = useState(false);
  const chosen = modelId || (p.armModels[0] ? String(p.armModels[0].id) : '');
  return (
    <div className="flex flex-col gap-2">
      <div role="toolbar" aria-label="Layout editing" className="flex flex-wrap items-center gap-2 rounded-control border border-rule bg-paper-raised px-2 py-1.5">
        {!p.readOnly && (
          <>
            <div className="flex items-center gap-1">
              <select
                aria-label="Arm model to add"
                value={chosen}
                onChange={(e) => setModelId(e.target.value)}
                className="h-7 max-w-52 rounded-control border border-rule-strong bg-paper-raised px-1 text-xs"
              >
                {p.armModels.map((m) => (
                  <option key={m.id} value={m.id}>
                    {m.name}
                  </option>
                ))}
              </select>
              <Button size="sm" variant="primary" disabled={!chosen} onClick={() => p.onAddArm(Number(chosen))}>
                Add arm
              </Button>
            </div>
            <span aria-hidden className="mx-1 h-5 w-px bg-rule" />
            <div role="group" aria-label="Tools" className="flex items-center gap-1">
              {TOOLS.map((t) => (
                <button
                  key={t.tool}
                  type="button"
                  title={t.title}
                  aria-pressed={p.tool === t.tool}
                  onClick={() => p.onTool(t.tool)}
                  className={cn(
                    'h-7 rounded-control border px-2.5 text-xs font-bold',
                    p.tool === t.tool ? 'border-accent bg-accent-wash text-accent-strong' : 'border-rule-strong bg-paper-raised text-ink hover:bg-paper-sunk',
                  )}
                >
                  {t.text}
                </button>
              ))}
            </div>
            <span aria-hidden className="mx-1 h-5 w-px bg-rule" />
            <Button size="sm" variant="quiet" disabled={!p.canUndo} onClick={p.onUndo} title={p.canUndo ? `Undo ${p.undoLabel} (Ctrl/⌘ Z)` : 'Nothing to undo'} aria-label="Undo">
              ↶ Undo
            </Button>
            <Button size="sm" variant="quiet" disabled={!p.canRedo} onClick={p.onRedo} title={p.canRedo ? `Redo ${p.redoLabel} (Shift Ctrl/⌘ Z)` : 'Nothing to redo'} aria-label="Redo">
              ↷ Redo
            </Button>
          </>
        )}
        {p.readOnly && (
          <>
            <div role="group" aria-label="Tools" className="flex items-center gap-1">
              <button
                type="button"
                title={SECTION_TOOL.title}
                aria-pressed={p.tool === 'section'}
                onClick={() => p.onTool(p.tool === 'section' ? 'select' : 'section')}
                className={cn(
                  'h-7 rounded-control border px-2.5 text-xs font-bold',
                  p.tool === 'section' ? 'border-accent bg-accent-wash text-accent-strong' : 'border-rule-strong bg-paper-raised text-ink hover:bg-paper-sunk',
                )}
              >
                {SECTION_TOOL.text}
              </button>
            </div>
            <span className="px-1 text-xs font-bold text-ink-muted">Read only — findings are shown as the planner sees them; a section line changes nothing.</span>
          </>
        )}
        <div className="ml-auto flex items-center gap-2">
          <SaveIndicator save={p.save} onRetry={p.onRetrySave} />
          {p.onFindPlace && !p.readOnly && (
            <Button size="sm" onClick={p.onFindPlace}>
              Find a place
            </Button>
          )}
          {!p.readOnly && p.onProposeGuardRing && (
            <Button size="sm" onClick={p.onProposeGuardRing}>
              Propose guard ring
            </Button>
          )}
          {p.onExportSheet && (
            <Button size="sm" onClick={p.onExportSheet}>
              Export plan sheet
            </Button>
          )}
          <Button size="sm" variant="quiet" aria-expanded={help} onClick={() => setHelp((h) => !h)}>
            Keys
          </Button>
        </div>
      </div>
      {help && (
        <dl aria-label="Keys" className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-0.5 rounded-control border border-rule bg-paper-raised px-3 py-2 text-xs">
          {KEY_HELP.map((k) => (
            <div key={k.keys} className="contents">
              <dt className="font-mono font-bold">{k.keys}</dt>
              <dd className="text-ink-muted">{k.does}</dd>
            </div>
          ))}
        </dl>
      )}
    </div>
  );
}

function SaveIndicator({ save, onRetry }: { save: SaveState; onRetry(): void }) {
  let text: string;
  let tone = 'text-ink-muted';
  switch (save.kind) {
    case 'saved':
      text = 'Saved';
      break;
    case 'pending':
      text = 'Unsaved changes';
      break;
    case 'saving':
      text = 'Saving…';
      break;
    case 'error':
      text = `Not saved: ${save.message}`;
      tone = 'text-finding-critical';
      break;
    case 'conflict':
      text = 'Changed elsewhere — not saved';
      tone = 'text-finding-critical';
      break;
  }
  return (
    <span className="flex items-center gap-2">
      <output aria-label="Save state" data-save-state={save.kind} className={cn('max-w-72 truncate text-xs font-bold', tone)} title={text}>
        {text}
      </output>
      {save.kind === 'error' && (
        <Button size="sm" onClick={onRetry}>
          Try again
        </Button>
      )}
    </span>
  );
}
