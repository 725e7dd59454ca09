export type Paper = "A4" | "letter";

/**
 * The report's print style sheet: the paper size (A4 or Letter) and margins, light colours
 * whatever the screen's theme, no app chrome or buttons, whole cards and rows kept together,
 * scrolling boxes opened out, and the intonation colours printed as they are.
 */
export function PrintStyles({ paper }: { paper: Paper }) {
  const css = `
@page { size: ${paper === "A4" ? "A4" : "letter"} portrait; margin: ${paper === "A4" ? "14mm 13mm" : "0.55in 0.5in"}; }
@media print {
  :root {
    color-scheme: light;
    --tn-paper: #ffffff; --tn-surface: #ffffff; --tn-ink: #1d2433; --tn-ink-muted: #4b5263; --tn-rule: #cfc8ba;
    --tn-copper: #b4532a; --tn-flat: #3b5ba5; --tn-sharp: #d9822b; --tn-flat-text: #3b5ba5; --tn-sharp-text: #a35c17;
    --tn-voice-teal: #2a7f7a; --tn-voice-plum: #7a4e8c; --tn-voice-ochre: #b38b2d; --tn-voice-slate: #4a5d73; --tn-voice-rose: #b25c6e; --tn-voice-olive: #6b7a3a;
  }
  html, body { background: #fff !important; background-image: none !important; font-size: 10pt; }
  * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  body header:not(main header), [data-print="hide"] { display: none !important; }
  main { max-width: none !important; padding: 0 !important; }
  [data-print="expand"] { max-height: none !important; overflow: visible !important; }
  section, figure, tr, dl > div { break-inside: avoid; }
  h2 { break-after: avoid; }
  section { box-shadow: none !important; }
  table { font-size: 8.5pt; }
  td, th { padding: 3px 5px !important; white-space: nowrap; }
  th svg { display: none; }
  a { text-decoration: none; }
}`;
  return <style>{css}</style>;
}
