/**
 * The one coded error type of Tapernote's server code. The HTTP status is derived
 * from the code, so a handler never picks a status by hand.
 */
export const ERROR_STATUS = {
  bad_request: 400,
  unauthorized: 401,
  no_credits: 402,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  validation_failed: 422,
  rate_limited: 429,
  internal: 500,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

export type FieldErrors = Record<string, string[]>;

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly fields?: FieldErrors;

  constructor(code: ErrorCode, message: string, fields?: FieldErrors) {
    super(message);
    this.name = "AppError";
    this.code = code;
    this.fields = fields;
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

export const notFound = (what = "This item") => new AppError("not_found", `${what} was not found.`);
export const forbidden = (message = "Your role in this studio does not allow this.") =>
  new AppError("forbidden", message);
export const unauthorized = () => new AppError("unauthorized", "Sign in to continue.");
export const conflict = (message: string) => new AppError("conflict", message);

export function isAppError(e: unknown): e is AppError {
  return e instanceof AppError;
}
