"use client";

import type { ReactNode } from "react";
import {
  createColumnHelper,
  createSortedRowModel,
  metaHelper,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_datetime,
  sortFn_text,
  tableFeatures,
  useTable,
  type ColumnDef,
  type Row,
  type RowData,
  type SortingState,
} from "@tanstack/react-table";
import { cx } from "./cx";

/** Per-column display options, set as `meta` on a column definition. */
export interface DataTableColumnMeta {
  /** "end" right-aligns the header and cells: use it for numbers. */
  align?: "start" | "end";
  headerClassName?: string;
  cellClassName?: string;
}

/**
 * The TanStack Table v9 feature set every DataTable uses: client-side sorting
 * and the column meta above. Column definitions must be typed against it, so
 * build them with {@link createDataTableColumns}.
 */
export const dataTableFeatures = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: {
    alphanumeric: sortFn_alphanumeric,
    text: sortFn_text,
    basic: sortFn_basic,
    datetime: sortFn_datetime,
  },
  columnMeta: metaHelper<DataTableColumnMeta>(),
});

export type DataTableFeatures = typeof dataTableFeatures;

/** A column of a DataTable over rows of type T. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- each column keeps its own value type
export type DataTableColumn<T extends RowData> = ColumnDef<DataTableFeatures, T, any>;

/**
 * The v9 column helper bound to DataTable's features:
 *
 *   const col = createDataTableColumns<Take>();
 *   const columns = col.columns([
 *     col.accessor("name", { header: "Take" }),
 *     col.accessor("durationSec", { header: "Length", meta: { align: "end" }, cell: (c) => <Mono>{c.getValue()}</Mono> }),
 *     col.display({ id: "actions", header: "", cell: ({ row }) => <Link href={…}>Open</Link> }),
 *   ]);
 *
 * Define the columns once (module scope or useMemo): a new array on every
 * render makes the table recompute its rows.
 */
export function createDataTableColumns<T extends RowData>() {
  return createColumnHelper<DataTableFeatures, T>();
}

export interface DataTableProps<T extends RowData> {
  columns: DataTableColumn<T>[];
  data: T[];
  /** e.g. [{ id: "createdAt", desc: true }]. Read once, when the table is created. */
  initialSorting?: SortingState;
  /** Shown in place of the rows when `data` is empty (and not loading). */
  emptyState?: ReactNode;
  /** Shows skeleton rows and marks the table busy. */
  isLoading?: boolean;
  /** Stable row ids (e.g. row => row.id) keep React keys right while sorting. */
  getRowId?: (row: T, index: number, parent?: Row<DataTableFeatures, T>) => string;
  /** Accessible name of the table, rendered as a visually hidden caption. */
  caption?: string;
  /** How many skeleton rows to show while loading (default 4). */
  skeletonRows?: number;
  className?: string;
}

// One empty array for every empty table, so `data={rows ?? []}` does not hand the table a new array each render.
const NO_ROWS: never[] = [];

function SortArrow({ direction }: { direction: false | "asc" | "desc" }) {
  return (
    <svg
      aria-hidden="true"
      viewBox="0 0 10 14"
      className={cx("h-3.5 w-2.5 shrink-0", direction ? "text-copper" : "text-ink-muted/50 group-hover:text-ink-muted")}
      fill="currentColor"
    >
      {direction !== "desc" ? <path d="M5 1.5 8.5 6h-7z" opacity={direction === "asc" ? 1 : 0.9} /> : null}
      {direction !== "asc" ? <path d="M5 12.5 1.5 8h7z" opacity={direction === "desc" ? 1 : 0.9} /> : null}
    </svg>
  );
}

/**
 * A sortable table on TanStack Table v9. Click a header to sort ascending,
 * click again for descending. Only accessor columns sort; set
 * `enableSorting: false` on a column to turn it off.
 */
export function DataTable<T extends RowData>({
  columns,
  data,
  initialSorting,
  emptyState,
  isLoading = false,
  getRowId,
  caption,
  skeletonRows = 4,
  className,
}: DataTableProps<T>) {
  const table = useTable({
    features: dataTableFeatures,
    columns,
    data: data.length === 0 ? (NO_ROWS as T[]) : data,
    getRowId,
    initialState: { sorting: initialSorting ?? [] },
    enableSortingRemoval: false,
    enableMultiSort: false,
    sortDescFirst: false,
  });

  const headerGroups = table.getHeaderGroups();
  const leafCount = table.getAllLeafColumns().length || 1;
  const rows = table.getRowModel().rows;

  return (
    <div className={cx("overflow-x-auto rounded-lg border border-rule bg-surface", className)}>
      <table className="w-full border-collapse text-left text-sm" aria-busy={isLoading || undefined}>
        {caption ? <caption className="sr-only">{caption}</caption> : null}
        <thead className="border-b border-rule bg-paper/70">
          {headerGroups.map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const column = header.column;
                const meta = column.columnDef.meta;
                const canSort = !header.isPlaceholder && column.getCanSort();
                const sorted = column.getIsSorted();
                const alignEnd = meta?.align === "end";
                return (
                  <th
                    key={header.id}
                    colSpan={header.colSpan > 1 ? header.colSpan : undefined}
                    scope="col"
                    aria-sort={canSort ? (sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none") : undefined}
                    className={cx(
                      "px-3 py-2.5 text-[0.8125rem] font-semibold text-ink-muted",
                      alignEnd ? "text-right" : "text-left",
                      meta?.headerClassName,
                    )}
                  >
                    {header.isPlaceholder ? null : canSort ? (
                      <button
                        type="button"
                        onClick={column.getToggleSortingHandler()}
                        className={cx(
                          "group -mx-1 inline-flex items-center gap-1.5 rounded px-1 py-0.5 font-semibold hover:text-ink",
                          sorted && "text-ink",
                          alignEnd && "flex-row-reverse",
                        )}
                      >
                        <span>
                          <table.FlexRender header={header} />
                        </span>
                        <SortArrow direction={sorted} />
                      </button>
                    ) : (
                      <table.FlexRender header={header} />
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {isLoading ? (
            Array.from({ length: skeletonRows }, (_, i) => (
              <tr key={`skeleton-${i}`} className="border-b border-rule/70 last:border-b-0" aria-hidden="true">
                {Array.from({ length: leafCount }, (_, j) => (
                  <td key={j} className="px-3 py-3">
                    <span
                      className="block h-3 animate-pulse rounded-note bg-rule/80"
                      style={{ width: `${45 + ((i * 7 + j * 13) % 5) * 10}%` }}
                    />
                  </td>
                ))}
              </tr>
            ))
          ) : rows.length === 0 ? (
            <tr>
              <td colSpan={leafCount} className="px-3 py-10 text-center text-ink-muted">
                {emptyState ?? "Nothing here yet."}
              </td>
            </tr>
          ) : (
            rows.map((row) => (
              <tr key={row.id} className="border-b border-rule/70 transition-colors last:border-b-0 hover:bg-paper/80">
                {row.getAllCells().map((cell) => {
                  const meta = cell.column.columnDef.meta;
                  return (
                    <td
                      key={cell.id}
                      className={cx(
                        "px-3 py-2.5 align-middle text-ink",
                        meta?.align === "end" && "text-right tabular-nums",
                        meta?.cellClassName,
                      )}
                    >
                      <table.FlexRender cell={cell} />
                    </td>
                  );
                })}
              </tr>
            ))
          )}
        </tbody>
      </table>
      {isLoading ? <span className="sr-only" role="status">Loading…</span> : null}
    </div>
  );
}
