import { emailAddress, z } from './common.js';

export const ReportQuery = z.object({
  format: z.enum(['pdf', 'csv']).default('pdf').openapi({ description: 'pdf (printable report) or csv (figures and events, one per row)' }),
});

export const ReportEmail = z
  .object({
    to: emailAddress().openapi({ example: 'bookings@millbrook-hall.test' }),
    message: z.string().trim().max(2000).optional().openapi({ description: 'A note placed above the summary in the e-mail' }),
  })
  .strict()
  .openapi('ReportEmail');

export const ReportEmailSent = z
  .object({ to: z.string(), subject: z.string(), filename: z.string(), verdict: z.string() })
  .openapi('ReportEmailSent');
