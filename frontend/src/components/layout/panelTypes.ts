import type { AnalysisResult } from '@shared/analysis';
import type { LayoutContent } from '@shared/schemas/layout';

/** What the editor selects: an arm, a work point, a boundary or a finding, by id. */
export interface LayoutSelection {
  kind: 'arm' | 'point' | 'boundary' | 'finding';
  id: string;
}

/** Props every layout panel (work points, coverage, shared zones) receives from the editor page. */
export interface LayoutPanelProps {
  /** The cell layout's name (export files say what they are of). */
  layoutName: string;
  content: LayoutContent;
  analysis: AnalysisResult | null;
  armModels: Array<{ id: number; name: string }>;
  readOnly: boolean;
  onEdit(next: LayoutContent, label: string): void;
  onSelect(sel: { kind: 'arm' | 'point' | 'boundary' | 'finding'; id: string } | null): void;
  selected: { kind: string; id: string } | null;
}
