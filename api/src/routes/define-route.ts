import type { Request, Response, Router } from 'express';
import { z } from 'zod';
import type { Permission } from '../auth/permissions.js';
import { holds } from '../auth/permissions.js';
import type { Scope } from '../auth/scope.js';
import { Problem } from '../errors/problem.js';
import type { Services } from '../services/index.js';
import type { Config } from '../config/config.js';
import { parseRequestPart } from './validate.js';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface ResponseSpec {
  description: string;
  /** JSON body schema; omit for empty responses. */
  schema?: z.ZodType;
  /** Other content types (CSV, PDF, NDJSON…), documented as strings or binary. */
  contentTypes?: string[];
}

/** Everything about one route that both Express and the OpenAPI document need. */
export interface RouteSpec {
  method: HttpMethod;
  /** OpenAPI-style path relative to /api/v1, e.g. `/sites/{siteId}`. */
  path: string;
  operationId: string;
  summary: string;
  description?: string;
  tags: string[];
  permission: Permission;
  params?: z.ZodType;
  query?: z.ZodType;
  headers?: z.ZodType;
  /** JSON request body. */
  body?: z.ZodType;
  /** Non-JSON request bodies the handler reads itself (content type -> description). */
  rawBody?: { description: string; contentTypes: Record<string, { schema?: z.ZodType; binary?: boolean }> };
  responses: Record<number, ResponseSpec>;
}

export interface HandlerContext<P, Q, B, H> {
  params: P;
  query: Q;
  body: B;
  headers: H;
  /** Present on every route except `public` ones. */
  scope: Scope;
  services: Services;
  config: Config;
  req: Request;
  res: Response;
}

/** What a handler returns: a status with an optional JSON body, or nothing (204, or it wrote `res` itself). */
export type HandlerResult = { status: number; body?: unknown; headers?: Record<string, string> } | void;

export interface RouteDefinition {
  spec: RouteSpec;
  // Method syntax on purpose: parameters are checked bivariantly, so typed handlers fit this erased slot.
  handle(ctx: HandlerContext<unknown, unknown, unknown, unknown>): Promise<HandlerResult> | HandlerResult;
}

type Infer<T> = T extends z.ZodType ? z.output<T> : undefined;

/** Declares a route; the handler's inputs are typed from the spec's schemas. */
export function defineRoute<S extends RouteSpec>(
  spec: S,
  handle: (ctx: HandlerContext<Infer<S['params']>, Infer<S['query']>, Infer<S['body']>, Infer<S['headers']>>) => Promise<HandlerResult> | HandlerResult,
): RouteDefinition {
  return { spec, handle };
}

/** `/sites/{siteId}` -> `/sites/:siteId` */
export function toExpressPath(path: string): string {
  return path.replace(/\{([A-Za-z0-9_]+)\}/g, ':$1');
}

/** Mounts routes on a router: permission check, validation of every part, then the handler. */
export function mountRoutes(router: Router, routes: RouteDefinition[], deps: { services: Services; config: Config }): void {
  for (const { spec, handle } of routes) {
    router[spec.method](toExpressPath(spec.path), async (req: Request, res: Response) => {
      if (spec.permission !== 'public') {
        if (!req.scope) throw new Problem('unauthenticated', 'Sign in, or send an API key as a bearer token');
        if (!holds(req.scope, spec.permission)) {
          throw new Problem('forbidden', `This action needs the "${spec.permission}" permission`);
        }
      }
      const ctx: HandlerContext<unknown, unknown, unknown, unknown> = {
        params: spec.params ? parseRequestPart(spec.params, req.params, 'params') : undefined,
        query: spec.query ? parseRequestPart(spec.query, req.query, 'query') : undefined,
        headers: spec.headers ? parseRequestPart(spec.headers, req.headers, 'headers') : undefined,
        body: spec.body ? parseRequestPart(spec.body, req.body ?? {}, 'body') : undefined,
        scope: req.scope as Scope,
        services: deps.services,
        config: deps.config,
        req,
        res,
      };
      const result = await handle(ctx);
      if (res.headersSent || res.writableEnded) return;
      if (!result) {
        res.status(204).end();
        return;
      }
      for (const [k, v] of Object.entries(result.headers ?? {})) res.setHeader(k, v);
      if (result.body === undefined) res.status(result.status).end();
      else res.status(result.status).json(result.body);
    });
  }
}
