"use client";
import { useRef, useState, type DragEvent } from "react";
import { Alert, Button, Card, cx } from "@/components/ui";
import { ACCEPT_ATTRIBUTE } from "@/lib/client/audio-file";
import { ConsentNotice, useUploadConsent } from "./ConsentNotice";
import { formatBytes, formatDuration } from "./format";
import { UploadRow } from "./UploadRow";
import { useLimits } from "./use-limits";
import { useUploads } from "./use-uploads";

/** Drag-and-drop or pick several takes; each gets its own progress bar and Cancel. */
export function UploadArea({ projectId }: { projectId: string }) {
  const limits = useLimits();
  const [consent, setConsent] = useUploadConsent();
  const uploads = useUploads(projectId, limits.data, !limits.isPending, consent);
  const inputRef = useRef<HTMLInputElement>(null);
  const [dragging, setDragging] = useState(false);

  const onDrop = (event: DragEvent<HTMLDivElement>) => {
    event.preventDefault();
    setDragging(false);
    uploads.addFiles(Array.from(event.dataTransfer.files));
  };
  const waiting = uploads.items.filter((it) => it.status === "queued").length;
  const finished = uploads.items.some((it) => it.status === "done" || it.status === "failed" || it.status === "cancelled");

  return (
    <Card title="Upload takes" description="WAV, FLAC, MP3, OGG or M4A. Several files at once are fine.">
      <div className="space-y-4">
        <ConsentNotice confirmed={consent} onChange={setConsent} />
        <div
          data-testid="drop-zone"
          onDragOver={(e) => {
            e.preventDefault();
            e.dataTransfer.dropEffect = "copy";
            setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDrop={onDrop}
          className={cx(
            "flex flex-col items-center justify-center gap-2 rounded-lg border-2 border-dashed px-6 py-8 text-center transition-colors",
            dragging ? "border-copper bg-copper/[0.06]" : "border-rule bg-paper/50",
          )}
        >
          <svg aria-hidden="true" viewBox="0 0 24 24" className="size-7 text-ink-muted" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeLinejoin="round">
            <path d="M12 15V4m0 0-4 4m4-4 4 4" />
            <path d="M4 15v3a2 2 0 0 0 2 2h12a2 2 0 0 0 2-2v-3" />
          </svg>
          <p className="text-[0.9375rem] text-ink">
            Drop recordings here, or{" "}
            <Button size="sm" variant="secondary" onClick={() => inputRef.current?.click()}>
              choose files
            </Button>
          </p>
          <p className="text-xs text-ink-muted">
            {limits.data
              ? <>Up to <span className="font-mono">{formatBytes(limits.data.maxBytes)}</span> and <span className="font-mono">{formatDuration(limits.data.maxDurationSec)}</span> per take. MP3, OGG and M4A are decoded in your browser first.</>
              : "MP3, OGG and M4A are decoded in your browser first."}
          </p>
          <input
            ref={inputRef}
            type="file"
            multiple
            accept={ACCEPT_ATTRIBUTE}
            className="sr-only"
            aria-label="Choose recordings to upload"
            tabIndex={-1}
            onChange={(e) => {
              uploads.addFiles(Array.from(e.target.files ?? []));
              e.target.value = "";
            }}
          />
        </div>
        {limits.isError ? (
          <Alert tone="info">The upload limits could not be loaded; the server will still check each file.</Alert>
        ) : null}
        {waiting > 0 && !consent ? (
          <Alert tone="info" title={waiting === 1 ? "1 file is waiting" : `${waiting} files are waiting`}>
            Confirm the notice above to send {waiting === 1 ? "it" : "them"}.
          </Alert>
        ) : null}
        {uploads.items.length > 0 ? (
          <div>
            <ul className="divide-y divide-rule/70" aria-label="Uploads">
              {uploads.items.map((item) => (
                <UploadRow
                  key={item.key}
                  item={item}
                  projectId={projectId}
                  onCancel={() => uploads.cancel(item.key)}
                  onDismiss={() => uploads.dismiss(item.key)}
                />
              ))}
            </ul>
            {finished ? (
              <div className="mt-2 flex justify-end">
                <Button size="sm" variant="ghost" onClick={uploads.clearFinished}>Clear finished</Button>
              </div>
            ) : null}
          </div>
        ) : null}
      </div>
    </Card>
  );
}
