export { createClient, unwrap, type ClientOptions, type HeadroomClient } from './client.js';
export { HeadroomApiError, type ProblemDetails, type ProblemFieldError } from './errors.js';
export type { components, operations, paths } from './generated/openapi.js';
