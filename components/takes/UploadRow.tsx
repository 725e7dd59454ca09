"use client";
import Link from "next/link";
import { Button, Mono, Spinner, cx } from "@/components/ui";
import { formatBytes } from "./format";
import type { UploadItem } from "./use-uploads";

const STATUS_TEXT: Record<UploadItem["status"], string> = {
  queued: "Waiting",
  preparing: "Preparing",
  uploading: "Uploading",
  processing: "Checking",
  done: "Uploaded",
  failed: "Not uploaded",
  cancelled: "Cancelled",
};

/** One file in the upload queue: name, size, a real progress bar, Cancel, then the result. */
export function UploadRow({
  item,
  projectId,
  onCancel,
  onDismiss,
}: {
  item: UploadItem;
  projectId: string;
  onCancel: () => void;
  onDismiss: () => void;
}) {
  const percent = item.totalBytes > 0 ? Math.min(100, Math.round((item.loadedBytes / item.totalBytes) * 100)) : 0;
  const active = item.status === "preparing" || item.status === "uploading" || item.status === "processing" || item.status === "queued";
  const barPercent = item.status === "done" || item.status === "processing" ? 100 : item.status === "uploading" ? percent : 0;
  const labelId = `${item.key}-name`;
  return (
    <li className="py-3" data-testid="upload-row" data-status={item.status}>
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <span id={labelId} className="min-w-0 flex-1 truncate font-medium" title={item.file.name}>{item.file.name}</span>
        <Mono className="text-sm text-ink-muted">{formatBytes(item.file.size)}</Mono>
        <span
          className={cx(
            "inline-flex items-center gap-1.5 text-sm",
            item.status === "failed" ? "text-danger" : item.status === "done" ? "text-success" : "text-ink-muted",
          )}
        >
          {item.status === "preparing" || item.status === "processing" ? <Spinner size="sm" /> : null}
          {STATUS_TEXT[item.status]}
          {item.status === "uploading" ? <Mono>{percent}%</Mono> : null}
        </span>
        {active ? (
          <Button size="sm" variant="secondary" onClick={onCancel} aria-label={`Cancel upload of ${item.file.name}`}>
            Cancel
          </Button>
        ) : (
          <Button size="sm" variant="ghost" onClick={onDismiss} aria-label={`Remove ${item.file.name} from this list`}>
            Dismiss
          </Button>
        )}
      </div>
      <div
        role="progressbar"
        aria-labelledby={labelId}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={barPercent}
        aria-valuetext={item.status === "uploading" ? `${percent}% sent` : STATUS_TEXT[item.status]}
        className="mt-2 h-1.5 overflow-hidden rounded-full bg-rule/70"
      >
        <div
          className={cx(
            "h-full rounded-full transition-[width] duration-200",
            item.status === "failed" ? "bg-danger" : item.status === "cancelled" ? "bg-ink-muted/40" : item.status === "done" ? "bg-success" : "bg-copper",
          )}
          style={{ width: `${item.status === "failed" || item.status === "cancelled" ? 100 : barPercent}%` }}
        />
      </div>
      {item.status === "uploading" ? (
        <p className="mt-1 text-xs text-ink-muted">
          <Mono>{formatBytes(item.loadedBytes)}</Mono> of <Mono>{formatBytes(item.totalBytes)}</Mono> sent
        </p>
      ) : null}
      {item.message ? (
        <p className={cx("mt-1 text-sm", item.status === "failed" ? "text-danger" : "text-ink-muted")} role={item.status === "failed" ? "alert" : undefined}>
          {item.message}
        </p>
      ) : null}
      {item.status === "done" && item.take ? (
        <p className="mt-1 text-sm text-ink-muted">
          Saved as{" "}
          <Link href={`/projects/${projectId}/takes/${item.take.id}`} className="font-medium text-ink underline underline-offset-2">
            {item.take.name}
          </Link>
          . Its analysis is shown in the takes below.
        </p>
      ) : null}
    </li>
  );
}
