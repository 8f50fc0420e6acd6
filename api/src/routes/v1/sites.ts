import { defineRoute, type RouteDefinition } from '../define-route.js';
import { Site, SiteCreate, SiteListQuery, SitePage, SiteParams, SiteUpdate } from './schemas/sites.js';

const tags = ['Sites'];

export const siteRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/sites',
      operationId: 'listSites',
      summary: 'List sites',
      tags,
      permission: 'read',
      query: SiteListQuery,
      responses: { 200: { description: 'A page of sites', schema: SitePage } },
    },
    async ({ services, scope, query }) => ({ status: 200, body: await services.sites.list(scope, query) }),
  ),
  defineRoute(
    {
      method: 'post',
      path: '/sites',
      operationId: 'createSite',
      summary: 'Create a site',
      tags,
      permission: 'write',
      body: SiteCreate,
      responses: { 201: { description: 'The new site', schema: Site } },
    },
    async ({ services, scope, body }) => ({ status: 201, body: await services.sites.create(scope, body) }),
  ),
  defineRoute(
    {
      method: 'get',
      path: '/sites/{siteId}',
      operationId: 'getSite',
      summary: 'Get a site',
      tags,
      permission: 'read',
      params: SiteParams,
      responses: { 200: { description: 'The site', schema: Site } },
    },
    async ({ services, scope, params }) => ({ status: 200, body: await services.sites.get(scope, params.siteId) }),
  ),
  defineRoute(
    {
      method: 'patch',
      path: '/sites/{siteId}',
      operationId: 'updateSite',
      summary: 'Update a site',
      tags,
      permission: 'write',
      params: SiteParams,
      body: SiteUpdate,
      responses: { 200: { description: 'The updated site', schema: Site } },
    },
    async ({ services, scope, params, body }) => ({ status: 200, body: await services.sites.update(scope, params.siteId, body) }),
  ),
  defineRoute(
    {
      method: 'delete',
      path: '/sites/{siteId}',
      operationId: 'deleteSite',
      summary: 'Delete a site with its circuits and loads',
      description: 'Traces of the site are kept and lose their link to it.',
      tags,
      permission: 'write',
      params: SiteParams,
      responses: { 204: { description: 'Deleted' } },
    },
    async ({ services, scope, params }) => {
      await services.sites.remove(scope, params.siteId);
    },
  ),
];
