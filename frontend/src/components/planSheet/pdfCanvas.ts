import type { PDFDocumentLoadingTask, PDFDocumentProxy } from 'pdfjs-dist';

type Pdfjs = typeof import('pdfjs-dist');
export type PdfDocument = PDFDocumentProxy;
export type PdfLoadingTask = PDFDocumentLoadingTask;

let loading: Promise<Pdfjs> | null = null;

/**
 * pdfjs-dist, loaded the first time a sheet is shown: it is the largest part of the client, and
 * pages that show no sheet (the layout editor among them) should not wait for it.
 */
export function loadPdfjs(): Promise<Pdfjs> {
  loading ??= Promise.all([import('pdfjs-dist'), import('pdfjs-dist/build/pdf.worker.min.mjs?url')]).then(([pdfjs, worker]) => {
    pdfjs.GlobalWorkerOptions.workerSrc = worker.default;
    return pdfjs;
  });
  return loading;
}

/** Draws one page of a PDF into a canvas `width` CSS pixels wide, sharp on high-density screens. */
export async function drawPdfPage(doc: PdfDocument, pageNumber: number, canvas: HTMLCanvasElement, width: number): Promise<void> {
  const page = await doc.getPage(pageNumber);
  const base = page.getViewport({ scale: 1 });
  const ratio = window.devicePixelRatio || 1;
  const viewport = page.getViewport({ scale: (width / base.width) * ratio });
  canvas.width = Math.floor(viewport.width);
  canvas.height = Math.floor(viewport.height);
  canvas.style.width = `${width}px`;
  canvas.style.height = `${Math.floor(viewport.height / ratio)}px`;
  await page.render({ canvas, viewport }).promise;
}
