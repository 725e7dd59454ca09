import type { Config } from "tailwindcss";

/**
 * Tapernote theme tokens (see NAMES.md, "Look").
 *
 * Every colour points at a CSS variable declared in app/globals.css, so one
 * class (bg-paper, text-ink …) serves both the light manuscript and the dark
 * mode, which keeps the same hues on #14181F. Loaded from the CSS entry with
 * `@config "../tailwind.config.ts";` (Tailwind v4 reads it as a legacy config).
 */
const config = {
  theme: {
    extend: {
      colors: {
        paper: "var(--tn-paper)",
        surface: "var(--tn-surface)",
        ink: {
          DEFAULT: "var(--tn-ink)",
          muted: "var(--tn-ink-muted)",
        },
        rule: "var(--tn-rule)",
        copper: "var(--tn-copper)",
        // Text and icons placed on a copper fill (primary buttons).
        "on-copper": "var(--tn-on-copper)",
        // Intonation: a diverging scale, in tune is plain ink.
        flat: "var(--tn-flat)",
        sharp: "var(--tn-sharp)",
        // Alerts and states (never used for intonation).
        danger: "var(--tn-danger)",
        success: "var(--tn-success)",
        voice: {
          teal: "var(--tn-voice-teal)",
          plum: "var(--tn-voice-plum)",
          ochre: "var(--tn-voice-ochre)",
          slate: "var(--tn-voice-slate)",
          rose: "var(--tn-voice-rose)",
          olive: "var(--tn-voice-olive)",
        },
      },
      fontFamily: {
        sans: [
          "var(--font-plex-sans)",
          "ui-sans-serif",
          "system-ui",
          "sans-serif",
        ],
        mono: [
          "var(--font-plex-mono)",
          "ui-monospace",
          "SFMono-Regular",
          "Menlo",
          "monospace",
        ],
      },
      borderRadius: {
        // Flat rounded rectangles, like the notes in the piano roll.
        note: "0.3125rem",
      },
      boxShadow: {
        card: "0 1px 0 0 var(--tn-rule), 0 1px 3px 0 rgb(29 36 51 / 0.06)",
      },
    },
  },
} satisfies Config;

export default config;
