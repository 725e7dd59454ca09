"use client";

import { useEffect, useId, useRef, type ReactNode } from "react";
import { cx } from "./cx";

export interface DialogProps {
  open: boolean;
  /** Called when the person asks to close: Esc, the close button, a click on the backdrop. */
  onClose: () => void;
  title: ReactNode;
  children?: ReactNode;
  /** Buttons row at the bottom, right-aligned. */
  footer?: ReactNode;
  /** Optional line under the title, linked with aria-describedby. */
  description?: ReactNode;
  /** When false, Esc, the backdrop and the close button do nothing (e.g. while saving). */
  dismissible?: boolean;
  size?: "sm" | "md" | "lg";
  className?: string;
}

const widths = { sm: "max-w-sm", md: "max-w-lg", lg: "max-w-2xl" } as const;

/**
 * A modal built on the native <dialog> element and showModal(), so focus is
 * trapped, the page behind is inert and Esc works without extra code. The
 * element that should take focus first may carry `data-autofocus`.
 */
export function Dialog({
  open,
  onClose,
  title,
  children,
  footer,
  description,
  dismissible = true,
  size = "md",
  className,
}: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const descriptionId = useId();
  // Latest props for the native event handlers below.
  const openRef = useRef(open);
  const onCloseRef = useRef(onClose);
  const dismissibleRef = useRef(dismissible);
  useEffect(() => {
    openRef.current = open;
    onCloseRef.current = onClose;
    dismissibleRef.current = dismissible;
  });

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      const previouslyFocused = document.activeElement as HTMLElement | null;
      dialog.showModal();
      dialog.querySelector<HTMLElement>("[data-autofocus]")?.focus();
      return () => {
        if (dialog.open) dialog.close();
        // Give focus back to whatever opened the dialog.
        if (previouslyFocused?.isConnected) previouslyFocused.focus();
      };
    }
    if (!open && dialog.open) dialog.close();
  }, [open]);

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    const onCancel = (event: Event) => {
      // Esc: let the owner decide by flipping `open`.
      event.preventDefault();
      if (dismissibleRef.current) onCloseRef.current();
    };
    const onNativeClose = () => {
      // Closed by the browser (e.g. a form with method="dialog") while the owner still says open.
      if (openRef.current) onCloseRef.current();
    };
    dialog.addEventListener("cancel", onCancel);
    dialog.addEventListener("close", onNativeClose);
    return () => {
      dialog.removeEventListener("cancel", onCancel);
      dialog.removeEventListener("close", onNativeClose);
    };
  }, []);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onClick={(event) => {
        // A click on the ::backdrop lands on the <dialog> itself.
        if (event.target === event.currentTarget && dismissible) onClose();
      }}
      className={cx(
        "m-auto w-[calc(100%-2rem)] rounded-lg border border-rule bg-surface p-0 text-ink shadow-2xl",
        "backdrop:bg-[rgb(20_24_31/0.45)] open:animate-[tn-dialog-in_140ms_ease-out]",
        widths[size],
        className,
      )}
    >
      {open ? (
        <div className="flex max-h-[calc(100dvh-4rem)] flex-col">
          <div className="flex items-start justify-between gap-4 border-b border-rule px-5 pt-4 pb-3">
            <div className="min-w-0">
              <h2 id={titleId} className="text-lg font-semibold text-ink">
                {title}
              </h2>
              {description ? (
                <p id={descriptionId} className="mt-1 text-sm text-ink-muted">
                  {description}
                </p>
              ) : null}
            </div>
            <button
              type="button"
              onClick={onClose}
              disabled={!dismissible}
              aria-label="Close"
              className="-mr-1.5 rounded-md p-1.5 text-ink-muted enabled:hover:bg-ink/[0.06] enabled:hover:text-ink disabled:opacity-40"
            >
              <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round">
                <path d="M4 4l8 8M12 4l-8 8" />
              </svg>
            </button>
          </div>
          <div className="overflow-y-auto px-5 py-4 text-[0.9375rem]">{children}</div>
          {footer ? (
            <div className="flex flex-wrap items-center justify-end gap-2 border-t border-rule bg-paper/60 px-5 py-3">
              {footer}
            </div>
          ) : null}
        </div>
      ) : null}
    </dialog>
  );
}
