/** Export writers (pure): Standard MIDI File, MusicXML 4.0, CSV; see docs/export.md. */
export type { ExportNote, TimeSignature } from "./types";
export { DEFAULT_TIME_SIGNATURE } from "./types";
export { notesToSmf, writeSmf, secToTicks, centsToBend, bendToCents, VOICE_CHANNELS, type SmfOptions, type SmfLayout } from "./midi";
export { notesToMusicXml, writeMusicXml, MUSICXML_PUBLIC_ID, MUSICXML_SYSTEM_ID, type MusicXmlOptions, type MusicXmlLayout, type QuantizedNote } from "./musicxml";
export { notesToCsv, csvField, csvRecord, CSV_COLUMNS, type CsvOptions } from "./csv";
export { estimateTempoBpm, clampTempoBpm, TEMPO_MIN_BPM, TEMPO_MAX_BPM, DEFAULT_TEMPO_BPM, type TempoEstimateOptions } from "./tempo";
export { encodeVlq, decodeVlq, VLQ_MAX } from "./vlq";
export { estimateKeyFifths, spellPitch, spelledToMidi, noteNameAscii, type SpelledPitch, type Step } from "./spelling";
export { parseGrid, snapInterval, type Grid } from "./grid";
