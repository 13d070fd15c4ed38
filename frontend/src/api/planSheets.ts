import { useMutation } from '@tanstack/react-query';
import { ApiError } from './client';

export type SheetSize = 'A3' | 'A4' | 'A1';
export const SHEET_SIZES: readonly SheetSize[] = ['A3', 'A4', 'A1'];
/** Standard drawing scales 1:N the server accepts ('auto' = largest that fits). */
export const SHEET_SCALES = [20, 25, 50, 100, 200, 250, 500] as const;
export const SHEET_KINDS = [
  { kind: 'plan', text: 'Plan' },
  { kind: 'schedule', text: 'Arm schedule' },
  { kind: 'coverage', text: 'Coverage matrix' },
  { kind: 'boundaries', text: 'Shared zones' },
  { kind: 'safeguarding', text: 'Safeguarding' },
  { kind: 'fences', text: 'Fence parts' },
  { kind: 'findings', text: 'Findings' },
  { kind: 'history', text: 'Revision history' },
] as const;
export type SheetKind = (typeof SHEET_KINDS)[number]['kind'];

export interface PlanSheetRequest {
  layoutId: number;
  size: SheetSize;
  scale: 'auto' | (typeof SHEET_SCALES)[number];
  sheets: SheetKind[];
}

/** The URL of a layout's working-copy plan sheet with its options. */
export function planSheetUrl(r: PlanSheetRequest): string {
  const q = new URLSearchParams({ size: r.size, scale: String(r.scale), sheets: r.sheets.join(',') });
  return `/api/layouts/${r.layoutId}/plan-sheet.pdf?${q.toString()}`;
}

/** The URL of a layout's DXF export (plan mm). */
export function layoutDxfUrl(layoutId: number): string {
  return `/api/layouts/${layoutId}/layout.dxf`;
}

async function fetchBytes(url: string): Promise<Blob> {
  let res: Response;
  try {
    res = await fetch(url, { credentials: 'same-origin' });
  } catch {
    throw new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.');
  }
  if (!res.ok) {
    const body = (await res.json().catch(() => null)) as { error?: { code?: string; message?: string; fields?: Record<string, string> } } | null;
    throw new ApiError(res.status, body?.error?.code ?? `http_${res.status}`, body?.error?.message ?? `The server answered ${res.status}.`, body?.error?.fields ?? {});
  }
  return res.blob();
}

/** Renders a plan sheet on the server; resolves to the PDF as a Blob. */
export function useRenderPlanSheet() {
  return useMutation({ mutationFn: (r: PlanSheetRequest) => fetchBytes(planSheetUrl(r)) });
}

/** Fetches the layout's DXF export as a Blob. */
export function useLayoutDxf() {
  return useMutation({ mutationFn: (layoutId: number) => fetchBytes(layoutDxfUrl(layoutId)) });
}

/** Hands a Blob to the browser as a file download. */
export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
