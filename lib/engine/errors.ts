/** Codes of the engine's one error type; the web app maps them to messages and statuses. */
export type EngineErrorCode =
  | "not_audio" // bytes are not a supported container
  | "unsupported_format" // a WAV/FLAC variant the engine does not read
  | "truncated" // header cut short or data missing
  | "empty" // zero samples
  | "bad_samples" // NaN or ±Inf samples
  | "too_long" // over the length limit
  | "bad_settings" // settings failed validation
  | "bad_argument"; // an invalid argument to an engine function

/** The engine's single typed error. `code` is stable; `message` is one readable line. */
export class EngineError extends Error {
  readonly code: EngineErrorCode;
  constructor(code: EngineErrorCode, message: string) {
    super(message);
    this.name = "EngineError";
    this.code = code;
  }
}

/** Alias kept for callers that only decode audio. */
export { EngineError as AudioDecodeError };
