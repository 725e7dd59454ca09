"use client";

import { useEffect } from "react";
import Link from "next/link";
import { Button } from "@/components/ui";

interface ErrorPageProps {
  error: unknown;
  /** Next 16.3+: re-fetches and re-renders the segment. */
  retry?: () => void;
  /** Clears the error state and re-renders without re-fetching. */
  reset?: () => void;
}

function digestOf(error: unknown): string | undefined {
  if (error && typeof error === "object" && "digest" in error && typeof error.digest === "string") {
    return error.digest;
  }
  return undefined;
}

export default function ErrorPage({ error, retry, reset }: ErrorPageProps) {
  useEffect(() => {
    // Stays in the browser console for whoever is debugging; never shown on the page.
    console.error(error);
  }, [error]);

  const digest = digestOf(error);

  return (
    <main className="mx-auto flex min-h-[60dvh] w-full max-w-xl flex-col items-center justify-center px-6 py-16 text-center">
      <svg aria-hidden="true" viewBox="0 0 120 48" className="h-12 w-30" fill="none">
        {[6, 15, 24, 33, 42].map((y) => (
          <line key={y} x1="2" x2="118" y1={y} y2={y} className="stroke-rule" strokeWidth="1.25" />
        ))}
        <rect x="20" y="26" width="30" height="6" rx="2.5" className="fill-voice-teal" />
        <rect x="58" y="17" width="14" height="6" rx="2.5" className="fill-voice-plum" />
        <path d="M82 8l14 30M96 8 82 38" className="stroke-copper" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <h1 className="mt-6 text-2xl font-semibold text-ink">Something went wrong</h1>
      <p className="mt-2 text-ink-muted" role="alert">
        This page could not be shown. Nothing you saved has been lost — try again, and if it keeps happening, come
        back in a little while.
      </p>
      <div className="mt-8 flex flex-wrap items-center justify-center gap-3">
        <Button onClick={() => (retry ?? reset)?.()}>Try again</Button>
        <Link
          href="/"
          className="inline-flex h-10 items-center rounded-md px-4 font-medium text-ink no-underline hover:bg-ink/[0.06]"
        >
          Go to the front page
        </Link>
      </div>
      {digest ? (
        <p className="mt-6 text-xs text-ink-muted">
          Reference <span className="font-mono">{digest}</span>
        </p>
      ) : null}
    </main>
  );
}
