import type { NextFunction, Request, RequestHandler, Response, Router } from 'express';
import type { z } from 'zod';
import type { Role } from '../../shared/roles';
import type { UserModel } from '../models/user-model';
import { authorize } from './authorize';
import { parseInput } from './validate';

/**
 * Who may call a route. Every route states it; `authorize` is the one place it is enforced.
 * public: anyone; signed-in: any active account; a role list: only those roles.
 */
export type Access = 'public' | 'signed-in' | readonly Role[];

type AnySchema = z.ZodType;
type Parsed<S> = S extends z.ZodType ? z.output<S> : undefined;

export interface HandlerContext<B, Q, P, A extends Access> {
  body: Parsed<B>;
  query: Parsed<Q>;
  params: Parsed<P>;
  /** The signed-in person; `authorize` guarantees one whenever access is not 'public'. */
  user: A extends 'public' ? UserModel | undefined : UserModel;
  req: Request;
  res: Response;
}

export interface RouteSpec<B = undefined, Q = undefined, P = undefined, R = unknown, A extends Access = Access> {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  /** Express-style path below /api, e.g. `/users/:id`. */
  path: string;
  summary: string;
  tag: string;
  access: A;
  body?: B;
  query?: Q;
  params?: P;
  /** Media type of the body when it is not JSON (e.g. a CSV upload). */
  bodyType?: 'text/csv' | 'multipart/form-data';
  /** Media type of a successful answer the handler streams itself (e.g. a CSV export). */
  producesType?: 'text/csv' | 'application/pdf' | 'application/ld+json' | 'application/octet-stream';
  /** Shape of a successful answer; the handler's result is checked against it. */
  response?: z.ZodType<R>;
  /** Status of a successful answer: 200 by default, 204 when there is no response schema. */
  successStatus?: number;
  /** Extra middleware run after access is checked and before validation (rate limits, uploads). */
  before?: RequestHandler[];
  /** Error statuses worth documenting besides the common ones. */
  errors?: number[];
  handler: (context: HandlerContext<B, Q, P, A>) => Promise<R | void> | R | void;
}

/** Keeps the generic parameters of one route spec inferred from its schemas. */
export function route<
  B extends AnySchema | undefined = undefined,
  Q extends AnySchema | undefined = undefined,
  P extends AnySchema | undefined = undefined,
  R = undefined,
  const A extends Access = Access,
>(spec: RouteSpec<B, Q, P, R, A>): RouteSpec<B, Q, P, R, A> {
  return spec;
}

// Specs are stored without their generics once defined; the handler typing was checked at `route()`.
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- heterogeneous list of checked specs
export type AnyRouteSpec = RouteSpec<any, any, any, any, any>;

/** Mounts each spec as: authorize(access) → before… → validate → handler → response check. */
export function mountRoutes(router: Router, specs: readonly AnyRouteSpec[]): void {
  for (const spec of specs) {
    const run = async (req: Request, res: Response, next: NextFunction) => {
      try {
        const input = parseInput(spec, req);
        const result = await spec.handler({ ...input, user: req.user as UserModel, req, res });
        if (res.headersSent) return;
        if (spec.response) {
          res.status(spec.successStatus ?? 200).json(spec.response.parse(result));
        } else {
          res.status(spec.successStatus ?? 204).end();
        }
      } catch (error) {
        next(error);
      }
    };
    router[spec.method](spec.path, authorize(spec.access), ...(spec.before ?? []), run);
  }
}
