/**
 * The one wrapper every route handler goes through: session → shop membership → role permission → zod input,
 * in that order, all read from the route's contract (server/api/contract.ts). Handlers never read the session themselves.
 */
import 'server-only';
import { and, asc, eq } from 'drizzle-orm';
import { type NextRequest, NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { shuttingDown } from './lifecycle.mjs';
import { StorageUnavailableError } from '@/db/object-store';
import { members, organizations, shopSettings } from '@/db/schema';
import { type ShopSettings, shopSettingsFrom } from '@/domain/shop-settings';
import { type InputOf, inputSchema, permissionOf, type RouteContract } from './api/contract';
import { getAuth } from './auth';
import { errorResponse, fieldErrors, HttpError } from './http';
import { rememberMembership } from './membership-cache';
import { inRequest, log, requestIdOf, safeError, shortId } from './log';
import { findNul, readLimited } from './request-body';
import { checkOrigin } from './origin';
import { can, type Permission, type RoleName } from './permissions';
import { spend } from './rate-limit';

export interface SessionContext {
  user: { id: string; name: string; email: string };
  sessionId: string;
  activeShopId: string | null;
}

export interface ShopContext<I> extends SessionContext {
  shop: { id: string; name: string; settings: ShopSettings };
  member: { id: string; role: RoleName };
  input: I;
  req: NextRequest;
}

type Params = Promise<Record<string, string>>;
/**
 * A handler answers what its contract's output describes once sent as JSON (dates become strings, so the type is
 * not checked here: the role matrix validates every real answer against the contract), or a Response of its own.
 */
type Answer = Promise<unknown>;
type Handler<C extends RouteContract> = (ctx: ShopContext<InputOf<C>> & { params: Record<string, string> }) => Answer;
/** A route handler as Next.js calls it, carrying the contract it serves (the route test reads it). */
export type RouteHandler = ((req: NextRequest, context: { params: Params }) => Promise<Response>) & { contract: RouteContract };

const serving = (contract: RouteContract, handler: (req: NextRequest, context: { params: Params }) => Promise<Response>): RouteHandler => Object.assign(handler, { contract });

const ACTIONS: Record<string, string> = {
  create: 'create',
  read: 'view',
  update: 'change',
  delete: 'delete',
  upload: 'upload',
  save: 'save',
  edit: 'edit',
  sign: 'sign',
  send: 'send',
  share: 'share',
  cancel: 'cancel',
  manage: 'manage',
};

/** The signed-in user, or a 401. */
export async function requireSession(req: { headers: Headers }): Promise<SessionContext> {
  const auth = await getAuth();
  const s = await auth.api.getSession({ headers: req.headers });
  if (!s) throw new HttpError(401, 'UNAUTHENTICATED', 'Sign in to continue.');
  const active = (s.session as { activeOrganizationId?: string | null }).activeOrganizationId ?? null;
  return { user: { id: s.user.id, name: s.user.name, email: s.user.email }, sessionId: s.session.id, activeShopId: active };
}

interface Membership {
  memberId: string;
  role: string;
  shopId: string;
  shopName: string;
  settings: ShopSettings;
}

/** The member's shop: the session's active shop, else their first membership; a 403 when they have none. */
export function resolveMembership(s: SessionContext): Promise<Membership> {
  return rememberMembership(`${s.user.id}|${s.activeShopId ?? ''}`, () => lookUpMembership(s));
}

async function lookUpMembership(s: SessionContext): Promise<Membership> {
  const db = await getDb();
  const rows = await db
    .select({
      memberId: members.id,
      role: members.role,
      shopId: organizations.id,
      shopName: organizations.name,
      timeZone: shopSettings.timeZone,
      temperatureUnit: shopSettings.temperatureUnit,
      distanceUnit: shopSettings.distanceUnit,
      phone: shopSettings.phone,
      address: shopSettings.address,
      pressureUnit: shopSettings.pressureUnit,
      startingLimits: shopSettings.startingLimits,
    })
    .from(members)
    .innerJoin(organizations, eq(members.organizationId, organizations.id))
    .leftJoin(shopSettings, eq(shopSettings.shopId, organizations.id))
    .where(s.activeShopId ? and(eq(members.userId, s.user.id), eq(members.organizationId, s.activeShopId)) : eq(members.userId, s.user.id))
    .orderBy(asc(members.createdAt))
    .limit(1);
  const found = rows[0];
  const row: Membership | undefined = found
    ? {
        memberId: found.memberId,
        role: found.role,
        shopId: found.shopId,
        shopName: found.shopName,
        settings: shopSettingsFrom(found),
      }
    : s.activeShopId
      ? await lookUpMembership({ ...s, activeShopId: null })
      : undefined;
  if (!row) throw new HttpError(403, 'NO_SHOP', 'You are not a member of a shop yet: create one, or accept an invitation from your shop owner.');
  return row;
}

async function readInput(req: NextRequest, params: Record<string, string>, rawBody = false): Promise<unknown> {
  const query = Object.fromEntries(req.nextUrl.searchParams.entries());
  const type = req.headers.get('content-type') ?? '';
  // A DELETE reads a body only when it sends JSON (removing a shop carries its typed name).
  const bodiless = req.method === 'GET' || req.method === 'HEAD' || (req.method === 'DELETE' && !type.includes('application/json'));
  if (rawBody || bodiless) return { ...query, ...params };
  if (!type.includes('application/json')) {
    throw new HttpError(415, 'UNSUPPORTED_MEDIA_TYPE', 'Send the request body as JSON (Content-Type: application/json).');
  }
  const bytes = await readLimited(req);
  // An empty DELETE says nothing more than its path, whatever its Content-Type.
  if (req.method === 'DELETE' && bytes.length === 0) return { ...query, ...params };
  let body: unknown;
  try {
    body = JSON.parse(new TextDecoder().decode(bytes));
  } catch {
    throw new HttpError(400, 'BAD_JSON', 'The request body is not valid JSON.');
  }
  if (typeof body !== 'object' || body === null || Array.isArray(body)) throw new HttpError(400, 'BAD_JSON', 'The request body must be a JSON object.');
  return { ...query, ...(body as object), ...params };
}

/** Parses query, body and route params merged, with the contract's schema; a 400 naming each wrong field in a sentence. */
async function parseInput<C extends RouteContract>(contract: C, req: NextRequest, params: Record<string, string>): Promise<InputOf<C>> {
  const schema = inputSchema(contract);
  const raw = await readInput(req, params, !!contract.upload);
  const nul = findNul(raw);
  if (nul) throw new HttpError(400, 'INVALID_INPUT', `The field "${nul}" holds a NUL character (\\u0000); remove it and send again.`, { [nul]: 'Remove the NUL character.' });
  const parsed = schema.safeParse(raw);
  if (parsed.success) return parsed.data as InputOf<C>;
  const fields = fieldErrors(parsed.error);
  throw new HttpError(400, 'INVALID_INPUT', `Check ${Object.keys(fields).length === 1 ? 'this field' : 'these fields'}: ${Object.values(fields).join(' ')}`, fields);
}

function describe(permission: Permission): string {
  const [resource, actions] = Object.entries(permission)[0] ?? ['that', ['do']];
  return `${(actions as string[]).map((a) => ACTIONS[a] ?? a).join(' or ')} ${resource === 'member' ? 'members' : resource === 'invitation' ? 'invitations' : `${resource}s`}`;
}

/**
 * What every wrapper does around its own checks: the request is admitted, runs, and its return value is sent as JSON (a Response is passed through) or its error as
 * the typed error body. With `rawBody` the handler streams the body itself and may stop part-way: on an error
 * the rest is let go and the connection closed, so the client hears the answer.
 */
function respond(req: NextRequest, work: (seen: Seen) => Promise<unknown>, rawBody = false): Promise<Response> {
  // Lines logged during the work (better-auth's included) carry the request id.
  return inRequest(requestIdOf(req.headers), () => respondInRequest(req, work, rawBody));
}

async function respondInRequest(req: NextRequest, work: (seen: Seen) => Promise<unknown>, rawBody: boolean): Promise<Response> {
  const started = performance.now();
  const seen: Seen = { requestId: requestIdOf(req.headers) };
  let res: Response;
  try {
    admit(req);
    const out = await work(seen);
    res = out instanceof Response ? out : NextResponse.json(out ?? { ok: true }, { headers: { 'cache-control': 'no-store' } });
  } catch (e) {
    res = handleError(e, seen);
    res.headers.set('cache-control', 'no-store');
    if (rawBody) {
      await req.body?.cancel().catch(() => {});
      res.headers.set('connection', 'close');
    }
  }
  log.info({ requestId: seen.requestId, method: req.method, route: req.nextUrl.pathname, status: res.status, ms: Math.round(performance.now() - started), shopId: seen.shopId, memberId: seen.memberId }, 'request');
  return res;
}

/** What the wrapper learnt about a request, for its log line. */
interface Seen {
  requestId: string;
  shopId?: string;
  memberId?: string;
}

/** Before any work: a request from another site is refused, and none is started while the server stops. */
function admit(req: Request): void {
  if (shuttingDown()) throw new HttpError(503, 'RESTARTING', 'The server is restarting; try again in a few seconds.');
  checkOrigin(req);
}

function handleError(e: unknown, seen: Seen): Response {
  if (e instanceof HttpError) return errorResponse(e);
  if (e instanceof StorageUnavailableError) {
    log.warn({ err: safeError(e.cause), requestId: seen.requestId, shopId: seen.shopId }, 'object storage not answering');
    return errorResponse(new HttpError(503, 'STORAGE_UNAVAILABLE', e.message));
  }
  log.error({ err: safeError(e), requestId: seen.requestId, shopId: seen.shopId, memberId: seen.memberId }, 'unhandled error');
  const err = new HttpError(500, 'INTERNAL', `Something went wrong on the server; try again, and if it keeps happening tell your shop owner the reference ${shortId(seen.requestId)}.`);
  err.detail = { requestId: seen.requestId };
  return errorResponse(err);
}

/**
 * Wraps a route handler: the contract's permission is checked against the member's role, its schemas parse
 * query, body and route params merged (for an upload, query and params only: the handler streams the body).
 */
export function withShop<C extends RouteContract>(contract: C, handler: Handler<C>): RouteHandler {
  const permission = permissionOf(contract);
  if (!permission) throw new Error(`${contract.method} ${contract.path} is not a shop route`);
  return serving(contract, (req, context) =>
    respond(
      req,
      async (seen) => {
        const session = await requireSession(req);
        const m = await resolveMembership(session);
        seen.shopId = m.shopId;
        seen.memberId = m.memberId;
        const role = m.role as RoleName;
        if (!can(role, permission)) {
          throw new HttpError(403, 'FORBIDDEN', `Your role (${role}) cannot ${describe(permission)}; ask your shop owner.`);
        }
        const params = (await context.params) ?? {};
        const input = await parseInput(contract, req, params);
        return handler({ ...session, shop: { id: m.shopId, name: m.shopName, settings: m.settings }, member: { id: m.memberId, role }, input, req, params });
      },
      !!contract.upload,
    ),
  );
}

/** For routes that need a signed-in user but no shop yet (creating a shop). */
export function withSession<C extends RouteContract>(contract: C, handler: (ctx: SessionContext & { input: InputOf<C>; req: NextRequest }) => Answer): RouteHandler {
  return serving(contract, (req, context) =>
    respond(req, async () => {
      const session = await requireSession(req);
      const input = await parseInput(contract, req, (await context.params) ?? {});
      return handler({ ...session, input, req });
    }),
  );
}

/**
 * For the customer's share-link routes, which have no session: a rate limit per client, then zod input.
 * The token in the input is the only scope; handlers answer 404 for any token that does not open a report.
 */
export function withPublic<C extends RouteContract>(contract: C, handler: (ctx: { input: InputOf<C>; req: NextRequest }) => Answer): RouteHandler {
  return serving(contract, (req, context) =>
    respond(req, async () => {
      await spend('share', req.headers);
      const input = await parseInput(contract, req, (await context.params) ?? {});
      return handler({ input, req });
    }),
  );
}
