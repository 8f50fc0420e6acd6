import SwaggerParser from '@apidevtools/swagger-parser';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildOpenApiDocument } from './document.js';
import { openApiYaml, OPENAPI_PATH } from './yaml.js';

describe('openapi.yaml', () => {
  it('when the routes are compared with the committed document, then it is up to date (run `npm run openapi`)', () => {
    expect(readFileSync(OPENAPI_PATH, 'utf8')).toBe(openApiYaml());
  });

  it('when checked by an independent validator, then the document is valid OpenAPI', async () => {
    // source: @apidevtools/swagger-parser validates against the official OpenAPI 3.1 JSON schema
    const doc = buildOpenApiDocument();
    await expect(SwaggerParser.validate(structuredClone(doc) as never)).resolves.toBeTruthy();
  });

  it('when operations are listed, then every one has a unique operationId and a problem response', () => {
    const doc = buildOpenApiDocument();
    const ids: string[] = [];
    for (const item of Object.values(doc.paths ?? {})) {
      for (const op of Object.values(item as Record<string, { operationId?: string; responses?: Record<string, unknown> }>)) {
        if (!op || typeof op !== 'object' || !('responses' in op)) continue;
        ids.push(op.operationId ?? '');
        expect(op.responses).toHaveProperty('400');
      }
    }
    expect(new Set(ids).size).toBe(ids.length);
    expect(ids.every(Boolean)).toBe(true);
  });
});
