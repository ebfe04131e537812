import type { NextFunction, Request, RequestHandler, Response, Router } from 'express';
import type { ZodType } from 'zod';
import { type Access, allows } from '../auth/permissions';
import type { User } from '../models/user';
import { forbidden, fromZod, unauthorized } from './errors';

export type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

export interface Ctx<P, Q, B> {
  params: P;
  query: Q;
  body: B;
  /** The signed-in user, or null on public routes. */
  user: User | null;
  req: Request;
  res: Response;
}

/** One API route: method, path, who may call it, zod schemas for its inputs, and a handler. */
export interface RouteSpec<P = unknown, Q = unknown, B = unknown> {
  method: Method;
  path: string;
  access: Access;
  summary: string;
  /** Success status; default 201 for POST, 200 otherwise. */
  status?: number;
  params?: ZodType<P>;
  query?: ZodType<Q>;
  body?: ZodType<B>;
  /** Middleware run after the access check and before validation (uploads). */
  before?: RequestHandler[];
  /** Returns the JSON body; `undefined` answers 204; a handler that wrote the response returns nothing. */
  handler: (ctx: Ctx<P, Q, B>) => Promise<unknown> | unknown;
}

export const route = <P = unknown, Q = unknown, B = unknown>(spec: RouteSpec<P, Q, B>) => spec as RouteSpec;

function parse<T>(schema: ZodType<T> | undefined, value: unknown, where: 'body' | 'query' | 'params'): T {
  if (!schema) return value as T;
  const r = schema.safeParse(value ?? {});
  if (!r.success) throw fromZod(r.error, where);
  return r.data;
}

function guard(access: Access): RequestHandler {
  return (req, _res, next) => {
    const user = (req.user as User | undefined) ?? null;
    if (access !== 'public' && !user) return next(unauthorized());
    if (!allows(access, user?.role ?? null)) return next(forbidden());
    next();
  };
}

export function mount(router: Router, specs: RouteSpec[]): void {
  for (const spec of specs) {
    const handler = async (req: Request, res: Response, next: NextFunction) => {
      try {
        const ctx: Ctx<unknown, unknown, unknown> = {
          params: parse(spec.params, req.params, 'params'),
          query: parse(spec.query, req.query, 'query'),
          body: parse(spec.body, req.body, 'body'),
          user: (req.user as User | undefined) ?? null,
          req,
          res,
        };
        const result = await spec.handler(ctx);
        if (res.headersSent) return;
        if (result === undefined) res.status(204).end();
        else res.status(spec.status ?? (spec.method === 'post' ? 201 : 200)).json(result);
      } catch (err) {
        next(err);
      }
    };
    router[spec.method](spec.path, guard(spec.access), ...(spec.before ?? []), handler);
  }
}
