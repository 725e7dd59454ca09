"use client";
import { useEffect, useState, type ReactNode } from "react";
import { ConfirmDialog } from "./ConfirmDialog";

export interface DeleteForGoodDialogProps<T> {
  /** The thing to delete; the dialog is open while it is set. */
  item: T | null;
  title: ReactNode;
  message: (item: T) => ReactNode;
  confirmLabel?: string;
  onCancel: () => void;
  /** Deletes it; a rejection is shown in the dialog, which stays open. */
  onDelete: (item: T) => Promise<unknown>;
  /** After a successful delete (close the dialog, navigate away …). */
  onDeleted: (item: T) => void;
}

/** The confirmation before deleting something for good, with its busy and failed states. */
export function DeleteForGoodDialog<T>({ item, title, message, confirmLabel = "Delete for good", onCancel, onDelete, onDeleted }: DeleteForGoodDialogProps<T>) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => setError(null), [item]);
  return (
    <ConfirmDialog
      open={item !== null}
      title={title}
      message={
        item !== null ? (
          <>
            {message(item)}
            {error ? <span className="mt-2 block text-danger" role="alert">{error}</span> : null}
          </>
        ) : null
      }
      confirmLabel={confirmLabel}
      danger
      busy={busy}
      onCancel={onCancel}
      onConfirm={async () => {
        if (item === null) return;
        setBusy(true);
        try {
          await onDelete(item);
          onDeleted(item);
        } catch (e) {
          setError(e instanceof Error ? e.message : "Deleting failed. Try again.");
        } finally {
          setBusy(false);
        }
      }}
    />
  );
}
