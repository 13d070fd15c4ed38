import { useEffect, useRef, useState } from 'react';
import { drawPdfPage, loadPdfjs, type PdfLoadingTask } from './pdfCanvas';

/** Page 1 of a PDF drawn into a canvas by pdfjs-dist (the browser's own copy of the sheet). */
export function SheetPreview({ pdf, width = 640 }: { pdf: Blob; width?: number }) {
  const canvas = useRef<HTMLCanvasElement>(null);
  // How the last drawing ended, with what it drew; one of another pdf or width is still being drawn.
  const [drawn, setDrawn] = useState<{ pdf: Blob; width: number; pages: number | null } | null>(null);
  const state = drawn?.pdf !== pdf || drawn.width !== width ? 'rendering' : drawn.pages === null ? 'error' : 'done';
  const pages = drawn?.pages ?? 0;

  useEffect(() => {
    let cancelled = false;
    let task: PdfLoadingTask | null = null;
    void (async () => {
      try {
        const data = new Uint8Array(await pdf.arrayBuffer());
        const pdfjs = await loadPdfjs();
        if (cancelled) return;
        task = pdfjs.getDocument({ data });
        const doc = await task.promise;
        const c = canvas.current;
        if (!c || cancelled) return;
        await drawPdfPage(doc, 1, c, width);
        if (!cancelled) setDrawn({ pdf, width, pages: doc.numPages });
      } catch {
        if (!cancelled) setDrawn({ pdf, width, pages: null });
      }
    })();
    return () => {
      cancelled = true;
      void task?.destroy();
    };
  }, [pdf, width]);

  return (
    <figure className="flex flex-col gap-1">
      <canvas ref={canvas} aria-label="Preview of sheet 1" data-preview-state={state} className="rounded-control border border-rule bg-white" />
      <figcaption className="text-xs text-ink-muted">
        {state === 'rendering' ? 'Drawing the preview…' : state === 'error' ? 'The preview could not be drawn; the file can still be downloaded.' : `Sheet 1 of ${pages}`}
      </figcaption>
    </figure>
  );
}
