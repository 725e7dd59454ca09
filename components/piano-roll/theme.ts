import { readVoiceColours } from "@/components/report/voices";

/** The colours and fonts the canvas draws with, read from the theme's CSS variables at draw time. */
export type RollTheme = {
  paper: string;
  surface: string;
  ink: string;
  muted: string;
  rule: string;
  copper: string;
  voices: string[];
  monoFont: string;
  dark: boolean;
};

export function readTheme(element: Element): RollTheme {
  const style = getComputedStyle(element);
  const v = (name: string, fallback: string) => style.getPropertyValue(name).trim() || fallback;
  const paper = v("--tn-paper", "#faf7f0");
  return {
    paper,
    surface: v("--tn-surface", "#fffdf8"),
    ink: v("--tn-ink", "#1d2433"),
    muted: v("--tn-ink-muted", "#5b6373"),
    rule: v("--tn-rule", "#d9d3c7"),
    copper: v("--tn-copper", "#b4532a"),
    voices: readVoiceColours(element),
    monoFont: `${v("--font-plex-mono", "")}${style.getPropertyValue("--font-plex-mono").trim() ? ", " : ""}ui-monospace, monospace`,
    dark: isDark(paper),
  };
}

function isDark(hex: string): boolean {
  const m = /^#([0-9a-f]{6})$/i.exec(hex);
  if (!m) return false;
  const n = parseInt(m[1]!, 16);
  return ((n >> 16) & 255) * 0.299 + ((n >> 8) & 255) * 0.587 + (n & 255) * 0.114 < 128;
}
