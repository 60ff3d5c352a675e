/**
 * One error type for everything that crosses the network. Route handlers throw
 * it; `toResponseBody` is what the client receives; the SWR fetcher turns the
 * body back into an `AppError` with `fromResponseBody`.
 */
export const ERROR_STATUS = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  rate_limited: 429,
  internal: 500,
  unavailable: 503,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

export interface ErrorIssue {
  path: (string | number)[];
  message: string;
}

export interface ErrorBody {
  /** `current`: on a save based on an old version, the row as it is now, to show beside the editor's. */
  error: { code: ErrorCode; message: string; issues?: ErrorIssue[]; current?: unknown };
}

export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly issues?: ErrorIssue[],
  ) {
    super(message);
    this.name = "AppError";
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }

  /** Headers the answer carries beside its status and body (none, except a rate limit's Retry-After). */
  get headers(): Record<string, string> | undefined {
    return undefined;
  }

  toResponseBody(): ErrorBody {
    return { error: { code: this.code, message: this.message, ...(this.issues ? { issues: this.issues } : {}) } };
  }

  static fromResponseBody(body: unknown, status: number): AppError {
    const error = (body as Partial<ErrorBody> | null)?.error;
    if (error && typeof error.message === "string" && typeof error.code === "string" && error.code in ERROR_STATUS) {
      // A save based on an old version: keep the row as it is now, for the side-by-side view.
      if (error.code === "conflict" && error.current !== undefined)
        return new VersionConflict(error.message, error.current);
      return new AppError(error.code, error.message, error.issues);
    }
    const code = (Object.entries(ERROR_STATUS).find(([, s]) => s === status)?.[0] ?? "internal") as ErrorCode;
    return new AppError(code, `The server answered ${status}.`);
  }
}

/**
 * A save based on a version that is no longer the row's (someone saved in between): 409, with the
 * row as it is now, so the editor can show theirs and the other's side by side and choose.
 */
export class VersionConflict extends AppError {
  constructor(
    message: string,
    readonly current: unknown,
  ) {
    super("conflict", message);
  }

  override toResponseBody(): ErrorBody {
    return { error: { code: this.code, message: this.message, current: this.current } };
  }
}

/** A rate limit's refusal: 429, with the wait in the message and, in whole seconds, in `Retry-After`. */
export class RateLimitedError extends AppError {
  constructor(
    message: string,
    readonly retryAfterSeconds: number,
  ) {
    super("rate_limited", message);
  }

  override get headers(): Record<string, string> {
    return { "Retry-After": String(this.retryAfterSeconds) };
  }
}
