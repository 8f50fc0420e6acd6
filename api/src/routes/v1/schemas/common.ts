import { extendZodWithOpenApi } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';

extendZodWithOpenApi(z);

export { z };

export const Id = z.string().min(1).max(64).openapi({ description: 'Identifier', example: '0b6f4c9e-2f7d-4f1c-9d55-1f0c3a6e2b11' });

/**
 * An e-mail address a mail server will take: the form zod checks, and the lengths of RFC 5321 §4.5.3.1
 * (local part at most 64 octets, domain at most 255), so a refused recipient is a 400 here rather than a
 * 503 from the mail server later.
 */
export const emailAddress = (message = 'must be an e-mail address') =>
  z
    .string()
    .trim()
    .max(320)
    .pipe(z.email(message))
    .refine((address) => {
      const at = address.lastIndexOf('@');
      return Buffer.byteLength(address.slice(0, at)) <= 64 && Buffer.byteLength(address.slice(at + 1)) <= 255;
    }, 'the part before @ must be at most 64 characters (RFC 5321)')
    .openapi({ format: 'email' });

export const Timestamp = z.string().openapi({ description: 'ISO 8601 date-time', example: '2026-11-30T09:15:00.000Z' });

export const Pagination = z.object({
  limit: z.coerce.number().int().min(1).max(500).default(50).openapi({ description: 'Page size' }),
  cursor: z.string().max(200).optional().openapi({ description: 'Opaque cursor from the previous page\'s `nextCursor`' }),
});

/** A page of a list: the items, the cursor of the next page (null at the end) and the total count. */
export function pageOf<T extends z.ZodType>(item: T, name: string) {
  return z
    .object({
      items: z.array(item),
      nextCursor: z.string().nullable(),
      total: z.number().int(),
    })
    .openapi(name);
}

export const ProblemFieldError = z
  .object({
    detail: z.string(),
    pointer: z.string().optional().openapi({ description: 'JSON Pointer into the request body' }),
    parameter: z.string().optional().openapi({ description: 'Query, path or header parameter' }),
    line: z.number().int().optional().openapi({ description: '1-based line in a CSV or NDJSON body' }),
    column: z.number().int().optional(),
  })
  .openapi('ProblemFieldError');

export const ProblemDetails = z
  .object({
    type: z.string().openapi({ example: '/problems/validation' }),
    title: z.string(),
    status: z.number().int(),
    detail: z.string(),
    instance: z.string(),
    requestId: z.string().optional(),
    errors: z.array(ProblemFieldError).optional(),
  })
  .catchall(z.unknown())
  .openapi('ProblemDetails', { description: 'RFC 9457 problem details' });
