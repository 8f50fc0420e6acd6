export { createClient, unwrap, type ClientOptions, type HeadroomClient } from './client.js';
export { createHeadroom, type Headroom, type HeadroomOptions } from './headroom.js';
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
export { sendBody, multipartBody, type SendOptions, type UploadProgress } from './upload.js';
export type { RequestOptions } from './resources/request-options.js';
export type { Site, SiteCreate, SiteUpdate, SiteFilters } from './resources/sites.js';
export type { Circuit, CircuitCreate, CircuitUpdate, CircuitFilters } from './resources/circuits.js';
export type { Load, LoadCreate, LoadUpdate, LoadFilters } from './resources/loads.js';
export type {
  AppendOptions,
  AppendProgress,
  AppendResult,
  CsvFile,
  ImportFields,
  ImportOptions,
  ImportResult,
  Trace,
  TraceClosed,
  TraceCreate,
  TraceEvents,
  TraceFilters,
  TraceSeries,
  TraceStats,
  TraceUpdate,
} from './resources/traces.js';
export type { HeadroomCheck, WhatIfCheck, WhatIfLoad } from './resources/checks.js';
export type { ReportEmail, ReportEmailSent, ReportFile, ReportFormat } from './resources/reports.js';
export type { AnalyzeRequest, AnalyzeResponse } from './resources/analyze.js';
export type { Me, SignedIn } from './resources/account.js';
export type { ApiKey, ApiKeyCreate, ApiKeyWithSecret, AuditEvent, AuditEventFilters, User, UserInvite, UserUpdate } from './resources/admin.js';
export type { BinaryValueType, Samples, SampleTime, TimedSamples, UniformSamples } from './samples.js';
export type { components, operations, paths } from './generated/openapi.js';
