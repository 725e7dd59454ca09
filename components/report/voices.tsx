/** Voice colours (NAMES.md): teal, plum, ochre, slate, rose, olive, in turn. Always shown with the voice's number. */
export const VOICE_NAMES = ["teal", "plum", "ochre", "slate", "rose", "olive"] as const;

/** Voices are numbered from 1; voice 0 (unassigned) takes the first colour too. */
export function voiceSlot(voice: number): number {
  return (((Math.max(1, Math.round(voice)) - 1) % VOICE_NAMES.length) + VOICE_NAMES.length) % VOICE_NAMES.length;
}

/** The CSS colour of a voice, following dark mode (for SVG and HTML). */
export function voiceCssColour(voice: number): string {
  return `var(--tn-voice-${VOICE_NAMES[voiceSlot(voice)]})`;
}

/** Light-mode hex of a voice, for a canvas when the theme variables cannot be read. */
export const VOICE_HEX = ["#2a7f7a", "#7a4e8c", "#b38b2d", "#4a5d73", "#b25c6e", "#6b7a3a"] as const;

/** Reads the theme's voice colours from the CSS variables, for drawing on a canvas. */
export function readVoiceColours(element: Element): string[] {
  const style = getComputedStyle(element);
  return VOICE_NAMES.map((name, i) => style.getPropertyValue(`--tn-voice-${name}`).trim() || VOICE_HEX[i]!);
}

export function VoiceSwatch({ voice }: { voice: number }) {
  return (
    <span aria-hidden="true" className="inline-block size-2.5 shrink-0 rounded-[2px]" style={{ backgroundColor: voiceCssColour(voice) }} />
  );
}
