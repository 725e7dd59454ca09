export { PianoRoll, type PianoRollProps, type PianoRollTool } from "./PianoRoll";
