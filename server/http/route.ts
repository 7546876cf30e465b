import type { Request, Response, Router, RequestHandler } from 'express';
import { z, type ZodType } from 'zod';
import { OpenAPIRegistry, OpenApiGeneratorV31, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import { ErrorEnvelopeSchema } from '@shared/contracts/common.ts';
import { UnauthenticatedError, ValidationError } from '../errors.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import type { Ability } from '@shared/roles.ts';

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/**
 * Who may call a route, checked in the gate before anything is parsed (so a role that may not
 * use a route hears 403, never a list of its field errors): an ability from shared/roles.ts,
 * any signed-in user, or anyone at all. Required on every route; the service still calls
 * authorize() itself.
 */
export type Access = Ability | 'signed-in' | 'public';

export interface RouteDef<B extends ZodType, Q extends ZodType, P extends ZodType> {
  method: Method;
  /** Express path, e.g. /parts/:sku (relative to /api). */
  path: string;
  summary: string;
  tag: string;
  /** Required: who may call it (see Access). Anything but 'public' answers 401 without a session. */
  ability: Access;
  body?: B;
  query?: Q;
  params?: P;
  /** Zod schema of the success body, for the OpenAPI document. */
  response?: ZodType;
  status?: number;
  /** For routes whose success is not JSON (files). */
  produces?: string;
  /** The multipart form an upload route reads (files arrive through its middleware), for the OpenAPI document. */
  upload?: ZodType;
  /** Runs after the gate, so nobody without the ability gets an upload buffered. */
  middleware?: RequestHandler[];
}

export interface RouteContext<B, Q, P> {
  actor: Actor;
  body: B;
  query: Q;
  params: P;
  req: Request;
  res: Response;
}

/** Collects every route's contract so /api/openapi.json can never fall behind the routes. */
export class Api {
  readonly registry = new OpenAPIRegistry();

  constructor(readonly router: Router) {}

  route<B extends ZodType = ZodType<undefined>, Q extends ZodType = ZodType<undefined>, P extends ZodType = ZodType<undefined>>(
    def: RouteDef<B, Q, P>,
    handler: (ctx: RouteContext<z.output<B>, z.output<Q>, z.output<P>>) => Promise<unknown> | unknown,
  ) {
    this.register(def);
    const run: RequestHandler = async (req, res) => {
      const actor = req.actor; // the gate below has already refused a missing session
      const body = parse(def.body, req.body, 'body');
      const query = parse(def.query, req.query, 'query');
      const params = parse(def.params, req.params, 'path');
      const result = await handler({ actor: actor as Actor, body, query, params, req, res } as never);
      // A handler may set its own status (health answers 503 when the database is down).
      if (!res.headersSent) (def.status ? res.status(def.status) : res).json(result);
    };
    const gate: RequestHandler = (req, _res, next) => {
      if (def.ability === 'public') return next();
      if (!req.actor) throw new UnauthenticatedError();
      if (def.ability !== 'signed-in') authorize(req.actor, def.ability);
      next();
    };
    this.router[def.method](def.path, gate, ...(def.middleware ?? []), run);
  }

  private register(def: RouteDef<ZodType, ZodType, ZodType>) {
    const errors = (description: string) => ({
      description,
      content: { 'application/json': { schema: ErrorEnvelopeSchema } },
    });
    const responses: RouteConfig['responses'] = {
      [def.status ?? 200]: def.produces
        ? { description: 'OK', content: { [def.produces]: { schema: z.string() } } }
        : { description: 'OK', content: def.response ? { 'application/json': { schema: def.response } } : undefined },
      400: errors('Invalid input'),
    };
    if (def.ability !== 'public') responses[401] = errors('Not signed in');
    if (def.ability !== 'public' && def.ability !== 'signed-in') responses[403] = errors('Role not allowed');
    this.registry.registerPath({
      method: def.method,
      path: `/api${def.path.replace(/:(\w+)/g, '{$1}')}`,
      summary: def.summary,
      description: def.ability === 'public' ? 'Open to anyone.' : def.ability === 'signed-in' ? 'Any signed-in user.' : `Needs the ability \`${def.ability}\`.`,
      tags: [def.tag],
      request: {
        body: def.body
          ? { content: { 'application/json': { schema: def.body } } }
          : def.upload
            ? { content: { 'multipart/form-data': { schema: def.upload } } }
            : undefined,
        query: def.query as never,
        params: def.params as never,
      },
      responses,
    });
  }

  document() {
    return new OpenApiGeneratorV31(this.registry.definitions).generateDocument({
      openapi: '3.1.0',
      info: { title: 'Stackyard API', version: '1.0.0', description: 'Parts, kits and stock for battery storage installs.' },
      servers: [{ url: '/' }],
    });
  }
}

function parse(schema: ZodType | undefined, value: unknown, where: string) {
  if (!schema) return undefined;
  const result = schema.safeParse(value ?? {});
  if (result.success) return result.data;
  throw new ValidationError(
    `Some ${where} fields are not valid: ${result.error.issues.map((i) => describeIssue(i)).join('; ')}`,
    { fields: result.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })) },
  );
}

function describeIssue(issue: z.core.$ZodIssue) {
  const at = issue.path.join('.');
  return at ? `${at}: ${issue.message}` : issue.message;
}
