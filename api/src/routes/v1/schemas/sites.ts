import { Id, Pagination, Timestamp, pageOf, z } from './common.js';

const text = (max: number) => z.string().trim().max(max);

export const SiteCreate = z
  .object({
    name: text(200).min(1, 'must not be empty').openapi({ example: 'Harbour Street bakery' }),
    address: text(500).nullable().optional(),
    clientContact: text(500).nullable().optional().openapi({ description: 'Client name, phone or e-mail' }),
    notes: text(5000).nullable().optional(),
  })
  .strict()
  .openapi('SiteCreate');

export const SiteUpdate = SiteCreate.partial().strict().openapi('SiteUpdate');

export const Site = z
  .object({
    id: Id,
    name: z.string(),
    address: z.string().nullable(),
    clientContact: z.string().nullable(),
    notes: z.string().nullable(),
    circuitCount: z.number().int(),
    createdAt: Timestamp,
    updatedAt: Timestamp,
  })
  .openapi('Site');

export const SitePage = pageOf(Site, 'SitePage');
export const SiteParams = z.object({ siteId: Id });
export const SiteListQuery = Pagination.extend({});
