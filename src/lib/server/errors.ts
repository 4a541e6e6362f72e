/**
 * Typed errors for expected failures on the server: bad configuration, missing rights,
 * unknown things. Each carries a stable dotted `code` and a message written for the reader;
 * routes map them to statuses once, and anything else is an unexpected error for `handleError`.
 */

/** Base class of expected server failures: a stable `code` plus a message the user may see. */
export class AppError extends Error {
  constructor(
    readonly code: string,
    message: string,
    options?: { cause?: unknown }
  ) {
    super(message, options);
    this.name = new.target.name;
  }
}

/**
 * The server cannot start as configured (bad env var, unwritable folder, unopenable database).
 * Its message is one line that says what to fix, so start-up and scripts print it without a stack.
 */
export class ConfigError extends AppError {}

/** A request needs a signed-in user and has none (HTTP 401). */
export class UnauthorizedError extends AppError {
  readonly status = 401;
}

/** The user is signed in but lacks the role this needs (HTTP 403). */
export class ForbiddenError extends AppError {
  readonly status = 403;
}

/** The thing does not exist, or the user may not know that it does (HTTP 404). */
export class NotFoundError extends AppError {
  readonly status = 404;
}

/** Input failed validation (HTTP 400); `fieldErrors` names each bad field. */
export class InputError extends AppError {
  readonly status = 400;
  constructor(
    code: string,
    message: string,
    readonly fieldErrors: Record<string, string> = {},
    options?: { cause?: unknown }
  ) {
    super(code, message, options);
  }
}
