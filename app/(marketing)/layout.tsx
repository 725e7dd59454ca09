import Link from "next/link";
import type { ReactNode } from "react";

function Wordmark() {
  return (
    <Link href="/" className="group inline-flex items-center gap-2 rounded-md text-ink no-underline">
      {/* A taper (window) over a hairline: the shape each analysis frame is given. */}
      <svg aria-hidden="true" viewBox="0 0 28 20" className="h-5 w-7" fill="none">
        <line x1="1" x2="27" y1="17" y2="17" className="stroke-rule" strokeWidth="1.5" />
        <path d="M2 17C7 17 9 3 14 3s7 14 12 14" className="stroke-copper" strokeWidth="2" strokeLinecap="round" />
        <rect x="11" y="8.5" width="6" height="3.5" rx="1.2" className="fill-voice-teal" />
      </svg>
      <span className="text-lg font-semibold tracking-tight">Tapernote</span>
    </Link>
  );
}

export default function MarketingLayout({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col">
      <header data-site-header className="border-b border-rule/80 bg-paper/85 backdrop-blur-sm">
        <nav
          aria-label="Main"
          className="mx-auto flex w-full max-w-6xl items-center justify-between gap-4 px-5 py-3.5 sm:px-8"
        >
          <Wordmark />
          <div className="flex items-center gap-1.5 text-sm sm:gap-3">
            <Link
              href="/sign-in"
              className="rounded-md px-3 py-2 font-medium text-ink no-underline hover:bg-ink/[0.06]"
            >
              Sign in
            </Link>
            <Link
              href="/sign-up"
              className="rounded-md bg-copper px-3.5 py-2 font-medium text-on-copper no-underline shadow-sm hover:brightness-95"
            >
              Create an account
            </Link>
          </div>
        </nav>
      </header>

      <main id="main" className="flex-1">
        {children}
      </main>

      <footer data-site-footer className="border-t border-rule/80">
        <div className="mx-auto flex w-full max-w-6xl flex-wrap items-center justify-between gap-2 px-5 py-6 text-sm text-ink-muted sm:px-8">
          <p>Tapernote — recordings into notes, for teachers, arrangers and studios.</p>
          <p>
            Set in IBM Plex, under the{" "}
            <a href="/fonts/OFL-IBM-Plex-Sans.txt" className="underline decoration-rule hover:text-ink">
              SIL Open Font License
            </a>
            .
          </p>
        </div>
      </footer>
    </div>
  );
}
