import { Router, type Request, type Response } from 'express';
import { z, type ZodType } from 'zod';
import { hasAnyRole, type Role } from '../../src/domain/people/roles';
import { HttpError } from './errors';

/**
 * Who may call a route. Every route must say so: there is no default, so a route cannot be added without
 * an access rule (deny by default).
 */
export type Access = 'public' | 'signed-in' | readonly Role[];

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteContext<B, Q, P> {
  req: Request;
  res: Response;
  body: B;
  query: Q;
  params: P;
  user: Express.User | undefined;
}

export interface RouteDef {
  method: Method;
  path: string;
  access: Access;
  status?: number;
  /** Express middleware run after access and before validation (rate limiters, uploads). */
  before?: ((req: Request, res: Response, next: (err?: unknown) => void) => void)[];
  body?: ZodType;
  query?: ZodType;
  params?: ZodType;
  handler: (ctx: RouteContext<unknown, unknown, unknown>) => unknown;
}

const empty = z.object({});
/** A write that declares no body takes none: anything sent is refused instead of silently ignored. */
const noBody = z.strictObject({}, 'This request takes no body.');

/** Declare one route: its access rule, its schemas and a handler that receives parsed input. */
export function route<B extends ZodType = typeof empty, Q extends ZodType = typeof empty, P extends ZodType = typeof empty>(def: {
  method: Method;
  path: string;
  access: Access;
  status?: number;
  before?: RouteDef['before'];
  body?: B;
  query?: Q;
  params?: P;
  handler: (ctx: RouteContext<z.output<B>, z.output<Q>, z.output<P>>) => unknown;
}): RouteDef {
  return def as RouteDef;
}

export function authorize(access: Access, user: Express.User | undefined): void {
  if (access === 'public') return;
  if (!user) throw new HttpError(401, 'unauthenticated', 'Sign in to continue.');
  if (access === 'signed-in') return;
  if (!hasAnyRole(user.roles, access)) {
    throw new HttpError(403, 'forbidden', 'Your roles do not allow this.');
  }
}

function parse(schema: ZodType | undefined, value: unknown, where: string): unknown {
  if (!schema) return {};
  const result = schema.safeParse(value ?? {});
  if (result.success) return result.data;
  throw new HttpError(
    400,
    'validation_failed',
    where === 'body' ? 'Some fields are not valid.' : `The ${where} is not valid.`,
    result.error.issues.map((issue) => ({
      path: issue.path.map(String).join('.') || `(${where})`,
      message: issue.message,
    })),
  );
}

export function mountRoutes(routes: readonly RouteDef[]): Router {
  const router = Router();
  for (const def of routes) {
    const guard = (req: Request, _res: Response, next: (err?: unknown) => void) => {
      authorize(def.access, req.user);
      next();
    };
    router[def.method](def.path, guard, ...(def.before ?? []), async (req: Request, res: Response) => {
      const ctx = {
        req,
        res,
        params: parse(def.params, req.params, 'path'),
        query: parse(def.query, req.query, 'query'),
        body: parse(def.body ?? (def.method === 'get' ? undefined : noBody), req.body, 'body'),
        user: req.user,
      };
      const result = await def.handler(ctx);
      if (res.headersSent) return;
      if (result === undefined) res.status(def.status ?? 204).end();
      else res.status(def.status ?? 200).json(result);
    });
  }
  return router;
}
