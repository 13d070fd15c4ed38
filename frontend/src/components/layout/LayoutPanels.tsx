import { lazy, Suspense, useMemo, useState, type ComponentType, type LazyExoticComponent } from 'react';
import { cn } from '../../lib/cn';
import { LoadingNotice } from '../Notice';
import type { LayoutPanelProps } from './panelTypes';

type PanelModule = Record<string, unknown>;

// The panels are separate modules; a tab appears once its module is part of the build.
const MODULES = import.meta.glob<PanelModule>(['./WorkPointsPanel.tsx', './CoverageMatrix.tsx', './SharedZonesTable.tsx', './FencePartsPanel.tsx']);

const TABS: ReadonlyArray<{ file: string; exportName: string; title: string }> = [
  { file: './WorkPointsPanel.tsx', exportName: 'WorkPointsPanel', title: 'Work points' },
  { file: './CoverageMatrix.tsx', exportName: 'CoverageMatrix', title: 'Coverage' },
  { file: './SharedZonesTable.tsx', exportName: 'SharedZonesTable', title: 'Shared zones' },
  { file: './FencePartsPanel.tsx', exportName: 'FencePartsPanel', title: 'Fence parts' },
];

function lazyPanel(file: string, exportName: string): LazyExoticComponent<ComponentType<LayoutPanelProps>> {
  return lazy(async () => {
    const mod = await MODULES[file]();
    const C = (mod[exportName] ?? mod.default) as ComponentType<LayoutPanelProps> | undefined;
    if (!C) throw new Error(`${file} exports no ${exportName}`);
    return { default: C };
  });
}

/** The tabs under the plan: work points, coverage matrix, shared zones (those that are built). */
export function LayoutPanels(props: LayoutPanelProps) {
  const tabs = useMemo(() => TABS.filter((t) => t.file in MODULES).map((t) => ({ ...t, Panel: lazyPanel(t.file, t.exportName) })), []);
  const [active, setActive] = useState(0);
  if (tabs.length === 0) return null;
  const tab = tabs[Math.min(active, tabs.length - 1)];
  return (
    <section aria-label="Layout tables" className="rounded-control border border-rule bg-paper-raised">
      <div role="tablist" aria-label="Layout tables" className="flex gap-1 border-b border-rule bg-paper-sunk px-2 pt-1.5">
        {tabs.map((t, i) => (
          <button
            key={t.file}
            type="button"
            role="tab"
            id={`layout-tab-${i}`}
            aria-selected={t === tab}
            aria-controls={`layout-tabpanel-${i}`}
            onClick={() => setActive(i)}
            className={cn(
              '-mb-px rounded-t-control border px-3 py-1.5 text-xs font-bold',
              t === tab ? 'border-rule border-b-paper-raised bg-paper-raised text-ink' : 'border-transparent text-ink-muted hover:text-ink',
            )}
          >
            {t.title}
          </button>
        ))}
      </div>
      <div role="tabpanel" id={`layout-tabpanel-${tabs.indexOf(tab)}`} aria-labelledby={`layout-tab-${tabs.indexOf(tab)}`} className="p-3">
        <Suspense fallback={<LoadingNotice />}>
          <tab.Panel {...props} />
        </Suspense>
      </div>
    </section>
  );
}
