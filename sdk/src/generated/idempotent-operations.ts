/**
 * This file was generated from openapi.yaml by sdk/scripts/idempotent-operations.ts.
 * Do not make direct changes to the file.
 *
 * Operations whose server keeps the first answer for an Idempotency-Key ("METHOD /path/{param}").
 */
export const IDEMPOTENT_OPERATIONS: readonly string[] = [
  'POST /traces',
  'POST /traces/import',
  'POST /traces/{traceId}/close',
  'POST /traces/{traceId}/samples'
];
