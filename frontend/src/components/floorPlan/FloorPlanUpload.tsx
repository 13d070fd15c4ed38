import { useId, useRef, useState, type DragEvent } from 'react';
import { errorMessage } from '../../api/client';
import { useUploadFloorPlan, type FloorPlanSummaryDto, type UploadProgress } from '../../api/floorPlans';
import { cn } from '../../lib/cn';
import { Button } from '../Button';
import { ErrorNotice } from '../Notice';

function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(0)} KB`;
  return `${(n / 1024 / 1024).toFixed(1)} MB`;
}

/**
 * Drop boundary and file picker for a DXF drawing: a percentage bar while the file is sent, then
 * "Reading the drawing…" while the server reads it; the server's own message when it refuses.
 */
export function FloorPlanUpload({ projectId, onUploaded }: { projectId: number; onUploaded: (plan: FloorPlanSummaryDto) => void }) {
  const inputId = useId();
  const hintId = useId();
  const input = useRef<HTMLInputElement>(null);
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const [fileName, setFileName] = useState<string | null>(null);
  const [over, setOver] = useState(false);
  const upload = useUploadFloorPlan(projectId, setProgress);
  const busy = upload.isPending;

  function send(file: File | undefined) {
    if (!file || busy) return;
    setFileName(file.name);
    setProgress({ phase: 'sending', loaded: 0, total: file.size });
    upload.mutate(file, {
      onSuccess: (plan) => onUploaded(plan),
      onSettled: () => {
        setProgress(null);
        if (input.current) input.current.value = '';
      },
    });
  }

  function onDrop(event: DragEvent) {
    event.preventDefault();
    setOver(false);
    send(event.dataTransfer.files[0]);
  }

  const percent =
    progress?.phase === 'sending' && progress.total > 0 ? Math.min(100, Math.round((progress.loaded / progress.total) * 100)) : progress ? 100 : 0;

  return (
    <div className="flex flex-col gap-3">
      <div
        onDragOver={(e) => {
          e.preventDefault();
          if (!busy) setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
        aria-busy={busy || undefined}
        className={cn(
          'flex flex-col items-start gap-3 rounded-control border-2 border-dashed px-6 py-6 transition-colors',
          over ? 'border-accent bg-accent-wash' : 'border-rule-strong bg-paper-raised',
        )}
      >
        {!busy ? (
          <>
            <p className="font-bold">Drop the building's DXF drawing here</p>
            <p id={hintId} className="text-sm text-ink-muted">
              ASCII DXF, any version. Lines, polylines, arcs, circles, blocks and text are read; units come from the file header.
            </p>
            <input
              ref={input}
              id={inputId}
              type="file"
              accept=".dxf,application/dxf,image/vnd.dxf"
              aria-describedby={hintId}
              className="sr-only"
              onChange={(e) => send(e.target.files?.[0])}
            />
            <Button variant="primary" onClick={() => input.current?.click()}>
              Choose a DXF file…
            </Button>
            <label htmlFor={inputId} className="sr-only">
              DXF file
            </label>
          </>
        ) : (
          <div className="flex w-full max-w-lg flex-col gap-2" role="status" aria-live="polite">
            <p className="text-sm">
              <span className="font-bold">{fileName}</span>
              {progress?.phase === 'sending' && progress.total > 0 && (
                <span className="text-ink-muted"> · {formatBytes(progress.loaded)} of {formatBytes(progress.total)}</span>
              )}
            </p>
            <div
              role="progressbar"
              aria-label="Upload"
              aria-valuemin={0}
              aria-valuemax={100}
              aria-valuenow={percent}
              className="h-2 w-full overflow-hidden rounded-full bg-paper-sunk"
            >
              <div className="h-full bg-accent transition-[width]" style={{ width: `${percent}%` }} />
            </div>
            <p className="flex items-center gap-2 text-sm text-ink-muted">
              {progress?.phase === 'reading' ? (
                <>
                  <span aria-hidden className="inline-block size-3 animate-spin rounded-full border-2 border-rule-strong border-t-accent" />
                  Reading the drawing…
                </>
              ) : (
                `Sending… ${percent} %`
              )}
            </p>
          </div>
        )}
      </div>
      {upload.isError && (
        <ErrorNotice title={`${fileName ?? 'The file'} could not be imported`} message={errorMessage(upload.error)} />
      )}
    </div>
  );
}
