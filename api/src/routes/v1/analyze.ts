import { defineRoute, type RouteDefinition } from '../define-route.js';
import { AnalyzeRequest, AnalyzeResponse } from './schemas/analyze.js';

export const analyzeRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'post',
      path: '/analyze',
      operationId: 'analyzeSamples',
      summary: 'Analyse samples without storing them',
      description:
        'Statistics, the RMS-series length, inrush events and surges of the samples in the body, stored nowhere. ' +
        'Send `t` (epoch ms or ISO 8601) with `a`, or `values` with `rate` (Hz) and optionally `start`. ' +
        'Times in the answer are epoch milliseconds (`…At`); durations are seconds (`…S`). ' +
        'The body is limited to the JSON body limit (5 MB by default, about 400,000 samples); store larger traces with /traces.',
      tags: ['Analysis'],
      permission: 'analyze',
      body: AnalyzeRequest,
      responses: { 200: { description: 'The analysis, with every parameter used', schema: AnalyzeResponse } },
    },
    ({ services, body }) => ({ status: 200, body: services.analysis.analyze(body) }),
  ),
];
