"use client";

import type { ReactNode } from "react";
import { Button } from "./Button";
import { Dialog } from "./Dialog";

export interface ConfirmDialogProps {
  open: boolean;
  title: ReactNode;
  message: ReactNode;
  /** Label of the confirming button, e.g. "Delete take". */
  confirmLabel: string;
  /** Label of the cancelling button; "Cancel" unless given. */
  cancelLabel?: string;
  /** Destructive action: the confirm button is red and Cancel takes focus first. */
  danger?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
  /** While true the confirm button spins and the dialog cannot be dismissed. */
  busy?: boolean;
}

/** Asks before doing something, such as deleting a take for good. */
export function ConfirmDialog({
  open,
  title,
  message,
  confirmLabel,
  cancelLabel = "Cancel",
  danger = false,
  onConfirm,
  onCancel,
  busy = false,
}: ConfirmDialogProps) {
  return (
    <Dialog
      open={open}
      onClose={onCancel}
      title={title}
      size="sm"
      dismissible={!busy}
      footer={
        <>
          <Button variant="secondary" onClick={onCancel} disabled={busy} data-autofocus={danger ? "" : undefined}>
            {cancelLabel}
          </Button>
          <Button
            variant={danger ? "danger" : "primary"}
            onClick={onConfirm}
            loading={busy}
            data-autofocus={danger ? undefined : ""}
          >
            {confirmLabel}
          </Button>
        </>
      }
    >
      <div className="text-ink">{message}</div>
    </Dialog>
  );
}
