/** Tapernote's analysis engine: pure TypeScript, typed arrays in, plain objects out. */
export { EngineError, AudioDecodeError, type EngineErrorCode } from "./errors";
export { decodeAudio, checkSamples, type DecodedAudio, type DecodeOptions } from "./decode";
export { resample } from "./resample";
export { TAPER_NAMES, type TaperName, type TaperProperties, makeTaper, fillTaper, taperProperties } from "./tapers";
export { SpectrumPlan } from "./stft";
export { findPeaks, PeakScratch, type PeakParams } from "./peaks";
export { MultiPitchEstimator, type MultiPitchConfig } from "./multipitch";
export { SpectralFlux, pickOnsets } from "./onsets";
export { trackNotes } from "./notes";
export { estimateReferenceHz, steadyPitchHz } from "./tuning";
export { settingsSchema, parseSettings, type Settings, type SettingsInput } from "./settings";
export { transcribe, registerPlan, ANALYSIS_RATE_HZ, type Note, type Transcription } from "./transcribe";
export { notesToMidi } from "./midi";
export { noteMetrics, type ScoredNote, type NoteMetrics, type NoteMetricOptions } from "./metrics";
export { chromaFrames } from "./chroma";
