"use client";
import { useMemo } from "react";
import { AnalysisBadge, Button, DataTable, Mono, createDataTableColumns } from "@/components/ui";
import { dateTimeFormat } from "./format";
import { summariseSettings } from "./settings-summary";
import { isRunning, type AnalysisDto } from "./types";
import { useAnalyses } from "./use-analyses";
import { useCancelAnalysis } from "./use-cancel-analysis";

const col = createDataTableColumns<AnalysisDto>();

/** Every analysis of a take, newest first. */
export function AnalysesTable({ takeId, canEdit }: { takeId: string; canEdit: boolean }) {
  const analyses = useAnalyses(takeId);
  const cancel = useCancelAnalysis();
  const cancelAnalysis = cancel.mutate;
  const cancelPending = cancel.isPending;
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor((a) => new Date(a.createdAt), {
          id: "createdAt",
          header: "Started",
          sortFn: "datetime",
          cell: (c) => <Mono>{dateTimeFormat.format(c.getValue())}</Mono>,
        }),
        col.accessor("state", {
          header: "State",
          cell: ({ row }) => (
            <span className="inline-flex items-center gap-2">
              <AnalysisBadge state={row.original.state} progressPercent={row.original.progress} />
              {row.original.state === "failed" && row.original.error ? (
                <span className="max-w-64 truncate text-xs text-ink-muted" title={row.original.error}>{row.original.error}</span>
              ) : null}
            </span>
          ),
        }),
        col.display({ id: "settings", header: "Settings", cell: ({ row }) => <span className="text-ink-muted">{summariseSettings(row.original.settings)}</span> }),
        col.accessor((a) => (a.finishedAt ? new Date(a.finishedAt) : new Date(0)), {
          id: "finishedAt",
          header: "Finished",
          sortFn: "datetime",
          cell: ({ row }) => <Mono>{row.original.finishedAt ? dateTimeFormat.format(new Date(row.original.finishedAt)) : "—"}</Mono>,
        }),
        col.display({
          id: "actions",
          header: () => <span className="sr-only">Actions</span>,
          cell: ({ row }) =>
            canEdit && isRunning(row.original) ? (
              <div className="flex justify-end">
                <Button size="sm" variant="ghost" onClick={() => cancelAnalysis(row.original.id)} disabled={cancelPending}>
                  Cancel
                </Button>
              </div>
            ) : null,
        }),
      ]),
    [canEdit, cancelAnalysis, cancelPending],
  );
  if (analyses.isError) return <p className="text-sm text-danger">The analyses could not be loaded: {analyses.error.message}</p>;
  return (
    <DataTable
      columns={columns}
      data={analyses.data ?? []}
      isLoading={analyses.isPending}
      getRowId={(a) => a.id}
      caption="Analyses of this take"
      initialSorting={[{ id: "createdAt", desc: true }]}
      skeletonRows={2}
      emptyState="No analyses yet."
    />
  );
}
