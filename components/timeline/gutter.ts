// Pure (no React), so scripts and the browser tests can read it too.
import { KEYBOARD_PX } from "@/components/piano-roll/geometry";

/** The left strip every time-aligned view keeps for labels (CSS px): the piano roll's keyboard. */
export const TIMELINE_GUTTER_PX = KEYBOARD_PX;
