import { defineRoute, type RouteDefinition } from '../define-route.js';
import { CircuitParams } from './schemas/circuits.js';
import { Load, LoadCreate, LoadListQuery, LoadPage, LoadParams, LoadUpdate } from './schemas/loads.js';

const tags = ['Loads'];

export const loadRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/circuits/{circuitId}/loads',
      operationId: 'listLoads',
      summary: 'List the loads on a circuit',
      tags,
      permission: 'read',
      params: CircuitParams,
      query: LoadListQuery,
      responses: { 200: { description: 'A page of loads', schema: LoadPage } },
    },
    async ({ services, scope, params, query }) => ({
      status: 200,
      body: await services.loads.list(scope, params.circuitId, query),
    }),
  ),
  defineRoute(
    {
      method: 'post',
      path: '/circuits/{circuitId}/loads',
      operationId: 'createLoad',
      summary: 'Add a load to a circuit',
      description:
        'A load needs a running figure: nameplate amps, watts (converted at the circuit voltage and power factor) or ' +
        'motor horsepower (NEC Table 430.248), unless traces recorded on it are linked.',
      tags,
      permission: 'write',
      params: CircuitParams,
      body: LoadCreate,
      responses: { 201: { description: 'The new load', schema: Load } },
    },
    async ({ services, scope, params, body }) => ({
      status: 201,
      body: await services.loads.create(scope, params.circuitId, body),
    }),
  ),
  defineRoute(
    {
      method: 'get',
      path: '/loads/{loadId}',
      operationId: 'getLoad',
      summary: 'Get a load',
      tags,
      permission: 'read',
      params: LoadParams,
      responses: { 200: { description: 'The load', schema: Load } },
    },
    async ({ services, scope, params }) => ({ status: 200, body: await services.loads.get(scope, params.loadId) }),
  ),
  defineRoute(
    {
      method: 'patch',
      path: '/loads/{loadId}',
      operationId: 'updateLoad',
      summary: 'Update a load',
      description: 'The merged load is checked as a whole; `null` clears an optional figure.',
      tags,
      permission: 'write',
      params: LoadParams,
      body: LoadUpdate,
      responses: { 200: { description: 'The updated load', schema: Load } },
    },
    async ({ services, scope, params, body }) => ({
      status: 200,
      body: await services.loads.update(scope, params.loadId, body),
    }),
  ),
  defineRoute(
    {
      method: 'delete',
      path: '/loads/{loadId}',
      operationId: 'deleteLoad',
      summary: 'Delete a load',
      description: 'Traces recorded on the load are kept and lose their link to it.',
      tags,
      permission: 'write',
      params: LoadParams,
      responses: { 204: { description: 'Deleted' } },
    },
    async ({ services, scope, params }) => {
      await services.loads.remove(scope, params.loadId);
    },
  ),
];
