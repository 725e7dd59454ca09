import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto flex min-h-[70dvh] w-full max-w-xl flex-col items-center justify-center px-6 py-16 text-center">
      <svg aria-hidden="true" viewBox="0 0 120 48" className="h-12 w-30 text-rule" fill="none">
        {[6, 15, 24, 33, 42].map((y) => (
          <line key={y} x1="2" x2="118" y1={y} y2={y} stroke="currentColor" strokeWidth="1.25" />
        ))}
        {/* a rest where a note should be */}
        <rect x="52" y="15" width="16" height="4.5" rx="1" className="fill-ink-muted" />
      </svg>
      <p className="mt-6 font-mono text-sm text-ink-muted">404</p>
      <h1 className="mt-1 text-2xl font-semibold text-ink">There is no page here</h1>
      <p className="mt-2 text-ink-muted">
        The link may be old, or the take or project may have been deleted. Check the address, or start again from
        the front page.
      </p>
      <Link
        href="/"
        className="mt-8 inline-flex h-10 items-center rounded-md bg-copper px-4 font-medium text-on-copper no-underline shadow-sm hover:brightness-95"
      >
        Go to the front page
      </Link>
    </main>
  );
}
