export { PianoRoll, type PianoRollProps, type PianoRollTool } from "./PianoRoll";
export type { OutlineNote, OutlineStyle, Outlines } from "./draw";
export { beatTicks, barBeatAt, validMeter, type Meter } from "./ruler";
