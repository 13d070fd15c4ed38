import { useEffect, useRef, useState } from 'react';
import { Button } from '../Button';
import { drawPdfPage, loadPdfjs, type PdfDocument as Doc, type PdfLoadingTask } from './pdfCanvas';

/**
 * A stored plan sheet shown in the page, sheet by sheet, drawn by pdfjs-dist (so it looks the same
 * in every browser, with or without a PDF plug-in). Fetches the PDF from `url` with the session.
 */
export function SheetViewer({ url, label }: { url: string; label: string }) {
  const canvas = useRef<HTMLCanvasElement>(null);
  const frame = useRef<HTMLDivElement>(null);
  // The document of a url (null when it could not be loaded) and the last page drawn from it: the
  // state shown follows from which url and page they belong to.
  const [loaded, setLoaded] = useState<{ url: string; doc: Doc | null } | null>(null);
  const [page, setPage] = useState(1);
  const [drawn, setDrawn] = useState<{ doc: Doc; page: number; ok: boolean } | null>(null);
  const doc = loaded?.url === url ? loaded.doc : null;
  const state: 'loading' | 'rendering' | 'done' | 'error' =
    loaded?.url !== url ? 'loading' : !doc ? 'error' : drawn?.doc !== doc || drawn.page !== page ? 'rendering' : drawn.ok ? 'done' : 'error';

  useEffect(() => {
    let cancelled = false;
    let task: PdfLoadingTask | null = null;
    void (async () => {
      try {
        const res = await fetch(url, { credentials: 'same-origin' });
        if (!res.ok) throw new Error(`HTTP ${res.status}`);
        const data = new Uint8Array(await res.arrayBuffer());
        const pdfjs = await loadPdfjs();
        if (cancelled) return;
        task = pdfjs.getDocument({ data });
        const d = await task.promise;
        if (!cancelled) {
          setLoaded({ url, doc: d });
          setPage(1);
        }
      } catch {
        if (!cancelled) setLoaded({ url, doc: null });
      }
    })();
    return () => {
      cancelled = true;
      void task?.destroy();
    };
  }, [url]);

  useEffect(() => {
    if (!doc) return;
    let cancelled = false;
    void (async () => {
      try {
        // The frame has 12 px padding and a 1 px border on each side.
        const width = Math.min((frame.current?.clientWidth ?? 1126) - 26, 1400);
        const c = canvas.current;
        if (!c || cancelled) return;
        await drawPdfPage(doc, page, c, width);
        if (!cancelled) setDrawn({ doc, page, ok: true });
      } catch {
        if (!cancelled) setDrawn({ doc, page, ok: false });
      }
    })();
    return () => {
      cancelled = true;
    };
  }, [doc, page]);

  const pages = doc?.numPages ?? 0;
  const go = (n: number) => setPage(Math.min(Math.max(1, n), pages || 1));
  return (
    <section
      ref={frame}
      aria-label={label}
      tabIndex={0}
      onKeyDown={(e) => {
        if (e.key === 'ArrowRight' || e.key === 'PageDown') go(page + 1);
        if (e.key === 'ArrowLeft' || e.key === 'PageUp') go(page - 1);
      }}
      className="flex flex-col gap-2 rounded-control border border-rule bg-paper-sunk p-3 focus-visible:outline-2 focus-visible:outline-accent"
    >
      <div className="flex items-center gap-2 text-sm">
        <Button onClick={() => go(page - 1)} disabled={page <= 1 || !doc}>
          Previous sheet
        </Button>
        <Button onClick={() => go(page + 1)} disabled={page >= pages || !doc}>
          Next sheet
        </Button>
        <span className="text-ink-muted" data-sheet-state={state}>
          {state === 'loading' ? 'Loading the plan sheet…' : state === 'error' ? 'The sheet could not be shown here; download it instead.' : `Sheet ${page} of ${pages}`}
        </span>
      </div>
      <canvas ref={canvas} aria-label={`${label}, sheet ${page}`} className="rounded-control border border-rule bg-white" />
    </section>
  );
}
