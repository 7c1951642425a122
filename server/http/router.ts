import express, { Router, type Request, type RequestHandler, type Response } from 'express';
import { authorize } from '@server/auth/middleware';
import type { AuthUser } from '@server/auth/session';
import type { WriteTurns } from '@server/db/write-turns';
import { validate, type Out, type Schemas } from './validate';

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

export interface Ctx<S extends Schemas> {
  req: Request;
  res: Response;
  params: Out<S['params']>;
  query: Out<S['query']>;
  body: Out<S['body']>;
  /** The signed-in user; null only on public routes. */
  user: AuthUser;
}

interface RouteSpec<S extends Schemas> {
  schemas?: S;
  /** Middleware that runs after the permission check and before validation (e.g. multer). */
  before?: RequestHandler[];
  /** The largest JSON body the route reads (`BODY_LIMIT` unless it takes whole sweeps or lots of values). */
  bodyLimit?: string;
  /**
   * The JSON body is not parsed here: the handler hands its bytes (`bodyBytes`) to a pool job that parses
   * and validates it (server/http/json-body.ts). For bodies of megabytes; the route has no body schema.
   */
  jsonInWorker?: boolean;
  /** Returns the JSON body (status 200, or `status`), or undefined after answering through ctx.res. */
  handle: (ctx: Ctx<S>) => unknown;
  status?: number;
}

/**
 * The JSON body a route reads unless it says otherwise: enough for every form and design (a 60-part
 * netlist, 2,000 frequencies, 1,000 reading ids), small enough to parse in a few milliseconds.
 */
export const BODY_LIMIT = '256kb';

/** A `jsonInWorker` route's body as received (empty when it was not sent as JSON). */
export function bodyBytes(req: Request): Uint8Array {
  return Buffer.isBuffer(req.body) ? new Uint8Array(req.body.buffer, req.body.byteOffset, req.body.byteLength) : new Uint8Array(0);
}

/** Waits until the request thread may write (a no-op in an app without write turns). */
export function takeWriteTurn(req: Request): Promise<void> {
  return (req.app.locals.writeTurns as WriteTurns | undefined)?.take() ?? Promise.resolve();
}

/**
 * A feature's routes under one prefix, registered with their full paths (so the app mounts every
 * ApiRouter at the root and a test can read each route's path from the router stack). Each route is guarded by the permission map
 * (server/auth/permissions.ts) before anything else runs; validation follows; the handler's
 * return value is sent as JSON.
 */
export class ApiRouter {
  readonly router = Router();
  constructor(readonly prefix: string) {}

  get<S extends Schemas>(path: string, spec: RouteSpec<S>) {
    return this.add('get', path, spec);
  }
  post<S extends Schemas>(path: string, spec: RouteSpec<S>) {
    return this.add('post', path, spec);
  }
  patch<S extends Schemas>(path: string, spec: RouteSpec<S>) {
    return this.add('patch', path, spec);
  }
  put<S extends Schemas>(path: string, spec: RouteSpec<S>) {
    return this.add('put', path, spec);
  }
  delete<S extends Schemas>(path: string, spec: RouteSpec<S>) {
    return this.add('delete', path, spec);
  }

  private add<S extends Schemas>(method: Method, path: string, spec: RouteSpec<S>): this {
    const fullPath = `${this.prefix}${path === '/' ? '' : path}`;
    const key = `${method.toUpperCase()} ${fullPath}`;
    const handler: RequestHandler = async (req, res) => {
      const valid = req.valid ?? {};
      // A change writes in its first synchronous steps: it takes a write turn first, so it never meets a
      // pool worker's write lock (server/db/write-turns.ts). Writes after an await take their own turn.
      if (method !== 'get') await takeWriteTurn(req);
      const result = await spec.handle({
        req,
        res,
        params: valid.params as Out<S['params']>,
        query: valid.query as Out<S['query']>,
        body: valid.body as Out<S['body']>,
        user: req.user as AuthUser,
      });
      if (result !== undefined && !res.headersSent) res.status(spec.status ?? 200).json(result);
      else if (!res.headersSent) res.status(spec.status ?? 204).end();
    };
    // The body is parsed only after the permission check has let the request through.
    const limit = spec.bodyLimit ?? BODY_LIMIT;
    const body = spec.jsonInWorker ? express.raw({ type: 'application/json', limit }) : express.json({ limit });
    this.router[method](fullPath, authorize(key), body, ...(spec.before ?? []), validate(spec.schemas ?? {}), handler);
    return this;
  }
}
