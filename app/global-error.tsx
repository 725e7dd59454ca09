"use client";

import { useEffect } from "react";

// Replaces the root layout when the layout itself fails, so it brings its
// own <html>, <body> and a few inline styles: globals.css and the fonts may
// not have loaded. The colours are the Tapernote tokens, light and dark.

interface GlobalErrorProps {
  error: unknown;
  retry?: () => void;
  reset?: () => void;
}

const css = `
  :root { color-scheme: light dark; --paper:#faf7f0; --ink:#1d2433; --muted:#5b6373; --rule:#d9d3c7; --copper:#b4532a; --on-copper:#fff; }
  @media (prefers-color-scheme: dark) { :root { --paper:#14181f; --ink:#e9e4d9; --muted:#a2a8b3; --rule:#2f3644; --copper:#d0703f; --on-copper:#14181f; } }
  body { margin:0; min-height:100dvh; display:flex; align-items:center; justify-content:center; background:var(--paper); color:var(--ink);
    font-family: "IBM Plex Sans", ui-sans-serif, system-ui, sans-serif; line-height:1.55; }
  main { max-width: 34rem; padding: 3rem 1.5rem; text-align:center; }
  h1 { font-size:1.5rem; font-weight:600; margin:1.5rem 0 0.5rem; }
  p { color:var(--muted); margin:0; }
  .row { margin-top:2rem; display:flex; gap:.75rem; justify-content:center; flex-wrap:wrap; }
  button, a.btn { font:inherit; font-weight:500; height:2.5rem; padding:0 1rem; border-radius:.375rem; display:inline-flex; align-items:center; text-decoration:none; }
  button { background:var(--copper); color:var(--on-copper); border:0; cursor:pointer; }
  a.btn { color:var(--ink); border:1px solid var(--rule); }
  :focus-visible { outline:2px solid var(--copper); outline-offset:2px; }
`;

export default function GlobalError({ error, retry, reset }: GlobalErrorProps) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <html lang="en">
      <body>
        <style>{css}</style>
        <main>
          <svg aria-hidden="true" viewBox="0 0 120 48" width="120" height="48" fill="none">
            {[6, 15, 24, 33, 42].map((y) => (
              <line key={y} x1="2" x2="118" y1={y} y2={y} stroke="var(--rule)" strokeWidth="1.25" />
            ))}
            <path d="M52 8l16 30M68 8 52 38" stroke="var(--copper)" strokeWidth="2" strokeLinecap="round" />
          </svg>
          <title>Tapernote — something went wrong</title>
          <h1>Tapernote could not load</h1>
          <p role="alert">
            Something went wrong on our side. Nothing you saved has been lost. Try again in a moment.
          </p>
          <div className="row">
            <button type="button" onClick={() => (retry ?? reset)?.()}>
              Try again
            </button>
            <a className="btn" href="/">
              Front page
            </a>
          </div>
        </main>
      </body>
    </html>
  );
}
