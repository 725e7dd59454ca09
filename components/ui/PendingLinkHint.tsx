"use client";
import { useLinkStatus } from "next/link";

/**
 * Put inside a `<Link>`: while the page it opens is on its way (pages answer in one piece, with
 * no loading page in between), a small pulsing dot beside the link says the click was taken.
 */
export function PendingLinkHint() {
  const { pending } = useLinkStatus();
  return (
    <span className="ml-1.5 inline-block w-1.5 align-middle" data-pending={pending ? "" : undefined}>
      {pending ? (
        <>
          <span aria-hidden className="inline-block size-1.5 animate-pulse rounded-full bg-copper" />
          <span className="sr-only">Opening…</span>
        </>
      ) : null}
    </span>
  );
}
