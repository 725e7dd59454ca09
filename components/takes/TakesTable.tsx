"use client";
import Link from "next/link";
import { useMemo, useState } from "react";
import {
  Alert,
  AnalysisBadge,
  Button,
  DeleteForGoodDialog,
  DataTable,
  EmptyState,
  Mono,
  createDataTableColumns,
  PendingLinkHint,
} from "@/components/ui";
import { dateTimeFormat, formatDuration } from "./format";
import type { TakeDto } from "./types";
import { useDeleteTake } from "./use-delete-take";
import { useTakes } from "./use-takes";
import { takeDeleteMessage } from "./take-delete";

const col = createDataTableColumns<TakeDto>();
const STATE_ORDER = { queued: 1, analysing: 2, ready: 3, failed: 4 } as const;

/** The takes of a project, live while any analysis runs. Listeners see it without Delete. */
export function TakesTable({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const takes = useTakes(projectId);
  const remove = useDeleteTake();
  const [deleting, setDeleting] = useState<TakeDto | null>(null);

  const columns = useMemo(
    () =>
      col.columns([
        col.accessor("name", {
          header: "Take",
          cell: (c) => (
            <Link href={`/projects/${projectId}/takes/${c.row.original.id}`} className="font-medium underline-offset-2 hover:underline">
              {c.getValue()}
              <PendingLinkHint />
            </Link>
          ),
        }),
        col.accessor("durationSec", {
          header: "Length",
          sortFn: "basic",
          meta: { align: "end" },
          cell: (c) => <Mono>{formatDuration(c.getValue())}</Mono>,
        }),
        col.accessor((t) => (t.analysis ? STATE_ORDER[t.analysis.state] : 0), {
          id: "analysis",
          header: "Analysis",
          sortFn: "basic",
          cell: ({ row }) => {
            const a = row.original.analysis;
            if (!a) return <span className="text-ink-muted">none</span>;
            return (
              <span className="inline-flex items-center gap-2" title={a.state === "failed" && a.error ? a.error : undefined}>
                <AnalysisBadge state={a.state} progressPercent={a.progress} />
                {a.state === "failed" && a.error ? <span className="max-w-56 truncate text-xs text-ink-muted">{a.error}</span> : null}
              </span>
            );
          },
        }),
        col.accessor((t) => t.noteCount ?? -1, {
          id: "noteCount",
          header: "Notes",
          sortFn: "basic",
          meta: { align: "end" },
          cell: ({ row }) => <Mono>{row.original.noteCount ?? "—"}</Mono>,
        }),
        col.accessor((t) => new Date(t.createdAt), {
          id: "createdAt",
          header: "Uploaded",
          sortFn: "datetime",
          cell: (c) => <Mono>{dateTimeFormat.format(c.getValue())}</Mono>,
        }),
        ...(canEdit ? [col.display({
          id: "actions",
          header: () => <span className="sr-only">Actions</span>,
          cell: ({ row }) =>
            canEdit ? (
              <div className="flex justify-end">
                <Button
                  size="sm"
                  variant="ghost"
                  onClick={() => setDeleting(row.original)}
                  aria-label={`Delete ${row.original.name}`}
                >
                  Delete
                </Button>
              </div>
            ) : null,
        })] : []),
      ]),
    [canEdit, projectId],
  );

  return (
    <section aria-labelledby="takes-heading" className="space-y-3">
      <h2 id="takes-heading" className="text-lg font-semibold">Takes</h2>
      {takes.isError ? (
        <Alert
          tone="error"
          title="The takes could not be loaded"
          action={<Button size="sm" variant="secondary" onClick={() => takes.refetch()}>Try again</Button>}
        >
          {takes.error.message}
        </Alert>
      ) : (
        <DataTable
          columns={columns}
          data={takes.data ?? []}
          isLoading={takes.isPending}
          getRowId={(t) => t.id}
          caption="Takes in this project"
          initialSorting={[{ id: "createdAt", desc: true }]}
          emptyState={
            <EmptyState
              title="No takes in this project yet"
              description={
                canEdit
                  ? "Upload a recording above: Tapernote analyses it and writes down its notes."
                  : "The studio’s editors have not uploaded a take here yet."
              }
            />
          }
        />
      )}

      <DeleteForGoodDialog
        item={deleting}
        title="Delete this take?"
        message={takeDeleteMessage}
        onCancel={() => setDeleting(null)}
        onDelete={(t) => remove.mutateAsync(t.id)}
        onDeleted={() => setDeleting(null)}
      />
    </section>
  );
}
