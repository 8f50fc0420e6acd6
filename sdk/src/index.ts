export { createClient, unwrap, type ClientOptions, type HeadroomClient } from './client.js';
export {
  HeadroomApiError,
  HeadroomAuthenticationError,
  HeadroomConflictError,
  HeadroomConnectionError,
  HeadroomNotFoundError,
  HeadroomPermissionError,
  HeadroomRateLimitError,
  HeadroomServerError,
  HeadroomValidationError,
  type ProblemDetails,
  type ProblemFieldError,
} from './errors.js';
export { newIdempotencyKey } from './idempotency.js';
export { paginate, pageThrough, type Page, type PageItem, type PageIterator, type PagedPath } from './paginate.js';
export { DEFAULT_RETRY, type RetryOptions } from './retry.js';
export type { components, operations, paths } from './generated/openapi.js';
