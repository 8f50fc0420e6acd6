import { randomUUID } from 'node:crypto';
import type { IncomingMessage } from 'node:http';
import { pinoHttp } from 'pino-http';
import type { Logger } from 'pino';

const REQUEST_ID = /^[A-Za-z0-9._-]{1,64}$/;

/**
 * Request ids and access logs. A caller's `X-Request-Id` is kept when it is a plain token, otherwise a
 * fresh id is made; the id is echoed in the response header and in every problem body. Only method,
 * path and status are logged: never bodies, query strings or the Authorization header.
 */
export function requestLogging(logger: Logger) {
  return pinoHttp({
    logger,
    genReqId: (req: IncomingMessage, res) => {
      const given = req.headers['x-request-id'];
      const id = typeof given === 'string' && REQUEST_ID.test(given) ? given : `r-${randomUUID().slice(0, 8)}`;
      res.setHeader('X-Request-Id', id);
      return id;
    },
    serializers: {
      req: (req: { id: string; method: string; url: string }) => ({ id: req.id, method: req.method, path: req.url.split('?')[0] }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
  });
}
