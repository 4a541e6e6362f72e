/**
 * Typed errors of waiver changes. Both map to an HTTP status through `status`, so form actions,
 * the API's `apiHandler` and tests read the same outcome.
 */
import { AppError } from '../errors';

/** The waiver is not in a state that allows this change (already decided, revoked, expired): HTTP 409. */
export class WaiverStateError extends AppError {
  readonly status = 409;
}

/** The project has no waiver with this id: HTTP 404. */
export class WaiverNotFoundError extends AppError {
  readonly status = 404;
}
