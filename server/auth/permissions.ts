/**
 * The one permission table of the API, the middleware that enforces it, and the route registry.
 *
 * How to add a lab-scoped route (every route under /api/v1/labs/:labId/... goes this way):
 *
 *   const r = Router();
 *   labRoute(r, deps.db, {
 *     method: 'get', path: '/labs/:labId/systems', action: 'systems.read',
 *     summary: 'List the systems of a lab', query: systemListQuerySchema, response: systemListSchema,
 *   }, async (req, res) => { ... req.lab.id, req.lab.role, req.user.id ... });
 *
 * and mount the router in server/routes/index.ts with `r.use(yourRoutes(deps))` and NO path prefix,
 * so that the path registered here is the path Express serves (a test compares the two).
 * Routes outside a lab (sign-in, accepting an invitation, /me) use `openRoute` with
 * access 'public' or 'signed-in'.
 *
 * `requireLabRole(db, action)` answers, in this order:
 *   401 without a session; 404 when the lab does not exist or the user is not a member of it
 *   (so nothing of one lab is visible from another, not even that it exists); 403 when the user's
 *   role in that lab lacks the action. Otherwise it sets `req.lab = { id, role }` and continues.
 *
 * Handlers of a lab route are typed `LabHandler`: `req.lab` and `req.user` are there (no `!`);
 * handlers of a 'signed-in' route are `SignedInHandler` (`req.user` is there).
 *
 * Every registration lands in `routeRegistry` (method + path → spec), which the OpenAPI document
 * (server/openapi.ts) and the route × role test read. Registration is idempotent, so building the
 * app twice (tests) does not duplicate entries.
 */
import type { NextFunction, Request, RequestHandler, Response, Router } from 'express';
import type { User } from 'lucia';
import type { z } from 'zod';
import type { Role } from '@/shared/api/auth';
import type { Db } from '../db/knex';
import { memberRole } from '../db/members';
import { AppError, forbidden, unauthorised } from '../errors';
import { requireUser } from './middleware';

export const ROLES = ['admin', 'analyst', 'reviewer', 'auditor'] as const satisfies readonly Role[];

const A: Role[] = ['admin'];
const ALL: Role[] = ['admin', 'analyst', 'reviewer', 'auditor'];
const BUILDERS: Role[] = ['analyst'];
const AUDIT: Role[] = ['admin', 'auditor'];

/**
 * Action → roles allowed. Admin: people, roles, lab settings, mail, audit, and reads everything.
 * Analyst: builds and runs (systems, scenarios, recipes, studies, uploads). Reviewer: reads what an
 * analyst reads, plus review decisions. Auditor: reads everything, including the audit trail.
 */
export const PERMISSIONS = {
  // people and the lab
  'members.read': ALL,
  'members.invite': A,
  'members.change-role': A,
  'members.remove': A,
  'invitations.read': A,
  'invitations.revoke': A,
  'lab.read': ALL,
  'lab.settings': A,
  'mail.read': A,
  'audit.read': AUDIT,
  'audit.export': AUDIT,
  // resources
  'systems.read': ALL,
  'systems.write': BUILDERS,
  'scenarios.read': ALL,
  'scenarios.write': BUILDERS,
  'recipes.read': ALL,
  'recipes.write': BUILDERS,
  'studies.read': ALL,
  'studies.start': BUILDERS,
  'studies.cancel': BUILDERS,
  'sweeps.read': ALL,
  'sweeps.start': BUILDERS,
  'sweeps.cancel': BUILDERS,
  'uploads.read': ALL,
  'uploads.write': BUILDERS,
  'exports.read': ALL,
  // review (decisions on others' work; the "not your own work" rule lives in the review service)
  'reviews.submit': BUILDERS,
  'reviews.decide': ['reviewer'],
  // approval and evidence: everyone reads reviews, standards and reports; the lab admin retires
  // a standard; analysts and the admin re-run a standard's evidence on today's engine
  'reviews.read': ALL,
  'standards.read': ALL,
  'standards.retire': A,
  'reports.read': ALL,
  'reverify.run': ['admin', 'analyst'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof PERMISSIONS;
export const ACTIONS = Object.keys(PERMISSIONS) as Action[];

/** Whether a role may perform an action. */
export function can(role: Role, action: Action): boolean {
  return (PERMISSIONS[action] as readonly Role[]).includes(role);
}

/** The lab of the path and the signed-in user's role in it. */
export interface LabAccess {
  id: string;
  role: Role;
}

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by requireLabRole. Lab route handlers see it as present (LabRequest). */
    lab?: LabAccess;
  }
}

/** A request that passed requireLabRole: signed in and a member of the lab of the path. */
export type LabRequest = Request & { lab: LabAccess; user: User };
/** A request that passed requireUser. */
export type SignedInRequest = Request & { user: User };
export type LabHandler = (req: LabRequest, res: Response, next: NextFunction) => unknown;
export type SignedInHandler = (req: SignedInRequest, res: Response, next: NextFunction) => unknown;

/**
 * Adapts a lab handler to Express. requireLabRole runs first, so lab and user are set; the check
 * narrows the type without a cast and turns a wiring mistake into a loud 500 instead of a
 * handler reading `undefined`.
 */
function asLabHandler(handler: LabHandler): RequestHandler {
  return (req, res, next) => {
    const { lab, user } = req;
    if (!lab || !user) throw new Error(`${req.method} ${req.path}: lab handler reached without requireLabRole`);
    return handler(Object.assign(req, { lab, user }), res, next);
  };
}

function asSignedInHandler(handler: SignedInHandler): RequestHandler {
  return (req, res, next) => {
    const { user } = req;
    if (!user) throw unauthorised();
    return handler(Object.assign(req, { user }), res, next);
  };
}

/** The answer for a lab that does not exist and for one the user is not a member of: the same. */
export const labNotFound = () => new AppError(404, 'not_found', 'This lab was not found.');

/** Middleware for /api/v1/labs/:labId/...: 401 / 404 / 403 as described at the top. */
export function requireLabRole(db: Db, action: Action): RequestHandler {
  if (!(action in PERMISSIONS)) throw new Error(`Unknown action "${action}"`);
  return async (req: Request, _res: Response, next: NextFunction) => {
    if (!req.user) throw unauthorised();
    const labId = String(req.params.labId ?? '');
    const role = await memberRole(db, labId, req.user.id);
    if (!role) throw labNotFound();
    if (!can(role, action)) throw forbidden(`Your role in this lab (${role}) does not allow ${action}.`);
    req.lab = { id: labId, role };
    next();
  };
}

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** One route of /api/v1, as the registry keeps it. Paths are Express paths relative to /api/v1. */
export interface RouteSpec {
  method: HttpMethod;
  path: string;
  /** A lab action, or who may call a route outside a lab. */
  action: Action | 'public' | 'signed-in';
  summary: string;
  tag?: string;
  body?: z.ZodType;
  query?: z.ZodType;
  response?: z.ZodType;
  /** Success status, 200 unless said (201 created, 204 no content). */
  status?: number;
  /** Media type of the success answer when it is not JSON (e.g. 'text/csv', 'text/event-stream'). */
  produces?: string;
}

export const routeRegistry = new Map<string, RouteSpec>();
const routeKey = (method: string, path: string) => `${method.toUpperCase()} ${path}`;

function register(spec: RouteSpec) {
  const key = routeKey(spec.method, spec.path);
  const known = routeRegistry.get(key);
  if (known && known.action !== spec.action) throw new Error(`Route ${key} registered twice with different actions`);
  routeRegistry.set(key, spec);
}

/** Registers and mounts a lab-scoped route behind requireLabRole(db, spec.action). */
export function labRoute(
  router: Router,
  db: Db,
  spec: RouteSpec & { action: Action },
  ...handlers: LabHandler[]
): void {
  if (!spec.path.startsWith('/labs/:labId')) throw new Error(`labRoute ${spec.path} must start with /labs/:labId`);
  register({ tag: tagOf(spec.path), ...spec });
  router[spec.method](spec.path, requireLabRole(db, spec.action), ...jsonOnly(spec), ...checkedResponse(spec), ...handlers.map(asLabHandler));
}

/** Registers and mounts a route outside a lab: 'public', or 'signed-in' (401 without a session). */
export function openRoute(router: Router, spec: RouteSpec & { action: 'signed-in' }, ...handlers: SignedInHandler[]): void;
export function openRoute(router: Router, spec: RouteSpec & { action: 'public' }, ...handlers: RequestHandler[]): void;
export function openRoute(
  router: Router,
  spec: RouteSpec & { action: 'public' | 'signed-in' },
  ...handlers: (RequestHandler | SignedInHandler)[]
): void {
  register({ tag: tagOf(spec.path), ...spec });
  if (spec.action === 'signed-in') {
    router[spec.method](spec.path, requireUser, ...jsonOnly(spec), ...checkedResponse(spec), ...(handlers as SignedInHandler[]).map(asSignedInHandler));
  } else {
    router[spec.method](spec.path, ...jsonOnly(spec), ...checkedResponse(spec), ...(handlers as RequestHandler[]));
  }
}

/**
 * A route with a JSON body schema refuses any other body with 415: express.json leaves a text/plain
 * or multipart body unread, and the handler would otherwise see an empty body (a schema of optional
 * fields then accepts it as a request that changes nothing, or names every field as missing).
 */
function jsonOnly(spec: RouteSpec): RequestHandler[] {
  if (!spec.body) return [];
  return [
    (req: Request, _res: Response, next: NextFunction) => {
      const hasBody = req.headers['transfer-encoding'] !== undefined || Number(req.headers['content-length'] ?? 0) > 0;
      if (hasBody && !req.is('application/json')) {
        throw new AppError(415, 'unsupported_media_type', 'Send this request as JSON (Content-Type: application/json).');
      }
      next();
    },
  ];
}

/**
 * In tests (NODE_ENV=test), a success answer sent with res.json must match the route's response
 * schema from shared/api, as the client will read it (after a JSON round trip), so server and
 * client cannot drift apart unnoticed. A mismatch throws: the error middleware logs it, naming the
 * route and the path of the first mismatch, and answers 500.
 */
function checkedResponse(spec: RouteSpec): RequestHandler[] {
  const schema = spec.response;
  if (!schema || process.env.NODE_ENV !== 'test') return [];
  return [
    (_req: Request, res: Response, next: NextFunction) => {
      const send = res.json.bind(res);
      res.json = (body: unknown) => {
        if (res.statusCode >= 200 && res.statusCode < 300) {
          const checked = schema.safeParse(body === undefined ? undefined : JSON.parse(JSON.stringify(body)));
          if (!checked.success) {
            const issue = checked.error.issues[0];
            throw new Error(
              `Response of ${spec.method.toUpperCase()} ${spec.path} does not match its schema at ${issue.path.join('.') || '(root)'}: ${issue.message}`,
            );
          }
        }
        return send(body);
      };
      next();
    },
  ];
}

function tagOf(path: string): string {
  const parts = path.split('/').filter((p) => p && !p.startsWith(':'));
  return (parts[0] === 'labs' ? parts[1] ?? 'labs' : parts[0]) ?? 'api';
}
