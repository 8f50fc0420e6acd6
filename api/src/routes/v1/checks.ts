import { defineRoute, type RouteDefinition } from '../define-route.js';
import { HeadroomCheck, CheckQuery, WhatIfCheck } from './schemas/checks.js';
import { CircuitParams } from './schemas/circuits.js';

const tags = ['Headroom checks'];
const judged =
  'Each load is judged on its recorded traces where it has them, otherwise on its nameplate. Steady loading is ' +
  'checked against NEC 210.19(A)/210.20(A) (continuous load), 210.23 (cord-and-plug and fastened-in-place shares, ' +
  'never above the rating); each start-up is stacked on the others\' running current against the device\'s ' +
  'instantaneous band, and the stacked profile runs through its thermal band. The reasons name the rule and the ' +
  'NEC edition; the cautions always apply.';

export const checkRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/circuits/{circuitId}/check',
      operationId: 'checkCircuit',
      summary: 'Headroom check of a circuit with its loads',
      description: judged,
      tags,
      permission: 'read',
      params: CircuitParams,
      query: CheckQuery,
      responses: {
        200: { description: 'The verdict, its reasons and the figures behind them', schema: HeadroomCheck },
        409: { description: 'The circuit as recorded cannot be judged (e.g. a device outside every trip model)' },
      },
    },
    async ({ services, scope, params, query }) => ({
      status: 200,
      body: await services.checks.check(scope, params.circuitId, { parameters: query }),
    }),
  ),
  defineRoute(
    {
      method: 'post',
      path: '/circuits/{circuitId}/check',
      operationId: 'checkCircuitWhatIf',
      summary: 'What-if headroom check: the circuit\'s loads plus hypothetical ones by nameplate',
      description: `${judged} Nothing is stored.`,
      tags,
      permission: 'read',
      params: CircuitParams,
      body: WhatIfCheck,
      responses: {
        200: { description: 'The verdict with the hypothetical loads added', schema: HeadroomCheck },
        409: { description: 'The circuit as recorded cannot be judged' },
      },
    },
    async ({ services, scope, params, body }) => ({
      status: 200,
      body: await services.checks.check(scope, params.circuitId, { extraLoads: body.extraLoads, parameters: body.parameters }),
    }),
  ),
];
