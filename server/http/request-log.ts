// Structured request logs: one JSON line per request with method, route pattern, status, duration and
// user id. Never bodies, query strings, headers or cookies (tokens travel in queries and bodies).
import type { RequestHandler } from 'express';
import pino from 'pino';
import { pinoHttp } from 'pino-http';

export function requestLogger(destination: NodeJS.WritableStream): RequestHandler {
  const logger = pino({ base: null, timestamp: pino.stdTimeFunctions.isoTime }, destination as pino.DestinationStream);
  return pinoHttp({
    logger,
    quietReqLogger: true,
    customAttributeKeys: { responseTime: 'durationMs' },
    serializers: {
      req: (req: { method: string; raw?: { originalUrl?: string; baseUrl?: string; route?: { path?: string } } }) => ({
        method: req.method,
      }),
      res: (res: { statusCode: number }) => ({ status: res.statusCode }),
      err: (err: Error) => ({ type: err.name }),
    },
    // pino-http asks for these props when the request starts and again when the answer has gone;
    // only the second knows the route and the user, so the first gives none (else each key is written twice).
    customProps: (req, res) => {
      if (!res.writableEnded) return {};
      const r = req as unknown as { route?: { path?: string }; user?: { id: string } | null; path?: string };
      return { route: r.route?.path ?? '(no route)', userId: r.user?.id ?? null };
    },
    customSuccessMessage: (req, res) => `${req.method} ${res.statusCode}`,
    customErrorMessage: (req, res) => `${req.method} ${res.statusCode}`,
  }) as unknown as RequestHandler;
}
