import fs from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import express, { type Express } from 'express';
import { authenticate, hostCheck, originCheck } from '@server/auth/middleware';
import { requestLogger } from '@server/http/request-log';
import type { AppContext } from '@server/context';
import { analysisRoutes } from '@server/features/analysis/router';
import { attachmentRoutes } from '@server/features/attachments/router';
import { authRoutes } from '@server/features/auth/router';
import { renderRoutes } from '@server/features/harness/render';
import { harnessRoutes } from '@server/features/harness/router';
import { compareRoutes } from '@server/features/compare/router';
import { healthRoutes } from '@server/features/health/router';
import { instrumentRoutes } from '@server/features/instruments/router';
import { jobRoutes } from '@server/features/jobs/router';
import { jobBeforeRoutes } from '@server/features/jobs/before';
import { lotRoutes } from '@server/features/lots/router';
import { outboxRoutes } from '@server/features/outbox/router';
import { partRoutes } from '@server/features/parts/router';
import { profileRoutes } from '@server/features/profiles/router';
import { readingRoutes } from '@server/features/readings/router';
import { sweepRoutes } from '@server/features/sweeps/router';
import { teamRoutes } from '@server/features/team/router';
import { apiNotFound, errorHandler } from '@server/http/errors';
import type { ApiRouter } from '@server/http/router';

/** Every feature's routes; each is guarded by the permission map. */
function featureRouters(ctx: AppContext): ApiRouter[] {
  return [
    healthRoutes(ctx),
    authRoutes(ctx),
    teamRoutes(ctx),
    outboxRoutes(ctx),
    partRoutes(ctx),
    analysisRoutes(ctx),
    readingRoutes(ctx),
    instrumentRoutes(ctx),
    profileRoutes(ctx),
    sweepRoutes(ctx),
    lotRoutes(ctx),
    ...harnessRoutes(ctx),
    renderRoutes(ctx),
    jobRoutes(ctx),
    jobBeforeRoutes(ctx),
    ...attachmentRoutes(ctx),
    ...compareRoutes(ctx),
  ];
}

export function createApp(ctx: AppContext): Express {
  const app = express();
  // The routes take a write turn before a change (server/http/router.ts).
  app.locals.writeTurns = ctx.writeTurns;
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  if (ctx.config.requestLog) app.use(requestLogger(ctx.config.requestLog));
  app.use(hostCheck(ctx.config.allowedHosts));
  // gzip, or brotli where the client accepts it; the lot items (several MB of JSON) shrink the most.
  app.use(compression());
  app.use((_req, res, next) => {
    if (ctx.config.production) res.setHeader('Strict-Transport-Security', 'max-age=31536000; includeSubDomains');
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Referrer-Policy', 'same-origin');
    res.setHeader('X-Frame-Options', 'DENY');
    // The built client loads only its own files; React and uPlot style through the DOM, hence 'unsafe-inline' for styles.
    res.setHeader(
      'Content-Security-Policy',
      "default-src 'self'; img-src 'self' data: blob:; style-src 'self' 'unsafe-inline'; font-src 'self'; object-src 'none'; base-uri 'self'; frame-ancestors 'none'; form-action 'self'",
    );
    next();
  });

  // JSON bodies are read by each route after its permission check (server/http/router.ts): no one parses
  // megabytes for a request that is refused anyway.
  app.use('/api', originCheck, authenticate(ctx.lucia));
  for (const api of featureRouters(ctx)) app.use(api.router);
  app.use('/api', apiNotFound);

  const clientDir = ctx.config.clientDir;
  if (clientDir && fs.existsSync(path.join(clientDir, 'index.html'))) {
    // Vite names every built asset by its content hash: cached for a year; index.html is checked every time.
    app.use(
      '/assets',
      express.static(path.join(clientDir, 'assets'), { index: false, fallthrough: false, immutable: true, maxAge: '365d' }),
    );
    app.use(express.static(clientDir, { index: false, maxAge: 0, setHeaders: (res) => res.setHeader('Cache-Control', 'no-cache') }));
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(clientDir, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } }));
  }

  app.use(errorHandler(ctx.log));
  return app;
}
