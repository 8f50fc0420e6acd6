import { defineRoute, type RouteDefinition } from '../define-route.js';
import { Circuit, CircuitCreate, CircuitListQuery, CircuitPage, CircuitParams, CircuitUpdate } from './schemas/circuits.js';
import { SiteParams } from './schemas/sites.js';

const tags = ['Circuits'];

export const circuitRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/circuits',
      operationId: 'listCircuits',
      summary: 'List circuits, optionally of one site',
      tags,
      permission: 'read',
      query: CircuitListQuery,
      responses: { 200: { description: 'A page of circuits', schema: CircuitPage } },
    },
    async ({ services, scope, query }) => ({ status: 200, body: await services.circuits.list(scope, query) }),
  ),
  defineRoute(
    {
      method: 'post',
      path: '/sites/{siteId}/circuits',
      operationId: 'createCircuit',
      summary: 'Add a circuit to a site',
      tags,
      permission: 'write',
      params: SiteParams,
      body: CircuitCreate,
      responses: { 201: { description: 'The new circuit', schema: Circuit } },
    },
    async ({ services, scope, params, body }) => ({
      status: 201,
      body: await services.circuits.create(scope, params.siteId, body),
    }),
  ),
  defineRoute(
    {
      method: 'get',
      path: '/circuits/{circuitId}',
      operationId: 'getCircuit',
      summary: 'Get a circuit',
      tags,
      permission: 'read',
      params: CircuitParams,
      responses: { 200: { description: 'The circuit', schema: Circuit } },
    },
    async ({ services, scope, params }) => ({ status: 200, body: await services.circuits.get(scope, params.circuitId) }),
  ),
  defineRoute(
    {
      method: 'patch',
      path: '/circuits/{circuitId}',
      operationId: 'updateCircuit',
      summary: 'Update a circuit',
      tags,
      permission: 'write',
      params: CircuitParams,
      body: CircuitUpdate,
      responses: { 200: { description: 'The updated circuit', schema: Circuit } },
    },
    async ({ services, scope, params, body }) => ({
      status: 200,
      body: await services.circuits.update(scope, params.circuitId, body),
    }),
  ),
  defineRoute(
    {
      method: 'delete',
      path: '/circuits/{circuitId}',
      operationId: 'deleteCircuit',
      summary: 'Delete a circuit with its loads',
      tags,
      permission: 'write',
      params: CircuitParams,
      responses: { 204: { description: 'Deleted' } },
    },
    async ({ services, scope, params }) => {
      await services.circuits.remove(scope, params.circuitId);
    },
  ),
];
