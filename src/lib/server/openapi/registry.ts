// The API description's registry: one entry per operation of a route under src/routes/api. Each
// entry names its SvelteKit route id, so the path and its parameters come from the route itself,
// and reuses the zod schemas the route parses with (src/lib/schemas). `document.ts` turns the
// entries into the OpenAPI 3.1 document; a unit test walks src/routes/api and fails when a route
// or one of its methods has no entry here, or an entry has no route.
import { z } from 'zod';
import type { ZodOpenApiResponseObject } from 'zod-openapi';
import { ROLES, roleAllows, scopesAllow, TOKEN_SCOPES, type Permission, type TokenScope } from '../../roles';
import { problemSchema } from './shapes';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Resources of the API: each operation belongs to one, and the readable page groups by them. */
export const RESOURCES = [
	{ name: 'Captures', description: 'One recording of a visit: its state, its stored analysis, its file, its band values.' },
	{ name: 'Visits', description: 'A measurement visit of a room (a "session" in the paths): its captures, uploads and averages.' },
	{ name: 'Comparisons', description: 'A before/after comparison of two visits of a room, its exports and its report.' },
	{ name: 'Treatment plans', description: 'A room\'s treatment plan worked through, and its cut list.' },
	{ name: 'Test signals', description: 'The sweeps a practice plays in the rooms it measures.' },
	{ name: 'Visit photos', description: 'Photos of a visit: of the room, or of one position.' },
	{ name: 'Description', description: 'This description itself.' }
] as const;
export type Resource = (typeof RESOURCES)[number]['name'];

/**
 * The scope a personal API token (`Authorization: Bearer rdt_…`) must carry for a permission,
 * from the token rules in roles.ts; null when no scope opens it (it stays in the browser). The
 * token acts with its owner's role and reach; the scope only narrows it.
 */
export function scopeFor(permission: Permission): TokenScope | null {
	return TOKEN_SCOPES.find((s) => scopesAllow([s], permission)) ?? null;
}

/** Refusals an operation can answer with; each is the Problem JSON shape. */
export type ErrorStatus = 400 | 401 | 403 | 404 | 409 | 413 | 422 | 429 | 503;

export interface ApiOperation {
	method: HttpMethod;
	/** The SvelteKit route id of its `+server.ts`, e.g. `/api/captures/[captureId=id]`. */
	route: string;
	resource: Resource;
	/** Unique, camelCase: what a generated client names the call. */
	operationId: string;
	summary: string;
	description?: string;
	/** The permission `authorize()` checks, or `public` for what anyone may read. */
	access: Permission | 'public';
	/** Query parameters: the zod object the route (or its helper) parses them with. */
	query?: z.ZodObject;
	/** Request headers the route reads (besides the credentials). */
	headers?: z.ZodObject;
	/** The request body by content type, with the schema the route parses it with. */
	body?: { description?: string; content: Record<string, z.ZodType> };
	/** Answers other than refusals, by status. */
	responses: Record<number, ZodOpenApiResponseObject>;
	/**
	 * Refusals this operation gives besides the ones every operation of its kind can give (401, 429
	 * and 503 when signed-in, 404 for a route with ids, 403 for a role or token that may not or a
	 * change from another site, 413 with a body), with what each means here.
	 */
	errors?: Partial<Record<ErrorStatus, string>>;
}

/** `/api/captures/[captureId=id]` → `/api/captures/{captureId}`. */
export function openApiPath(route: string): string {
	return route.replace(/\[(?:\.\.\.)?([A-Za-z]+)(?:=[a-z]+)?\]/g, '{$1}');
}

/** The parameters of a route id, with their matchers: `[captureId=id]` → captureId, id. */
export function routeParams(route: string): { name: string; matcher: string | null }[] {
	return [...route.matchAll(/\[(?:\.\.\.)?([A-Za-z]+)(?:=([a-z]+))?\]/g)].map((m) => ({ name: m[1], matcher: m[2] ?? null }));
}

/** What `src/params/id.ts` lets through: a positive whole number. */
const idParam = z.coerce.number().int().positive();

const PARAM_NAMES: Record<string, string> = {
	captureId: 'capture',
	sessionId: 'visit',
	comparisonId: 'comparison',
	roomId: 'room',
	sweepId: 'test signal',
	photoId: 'photo'
};

/** The path parameters of a route as one zod object (every `=id` parameter is a positive integer). */
export function pathParamsSchema(route: string): z.ZodObject | undefined {
	const params = routeParams(route);
	if (params.length === 0) return undefined;
	const shape: Record<string, z.ZodType> = {};
	for (const p of params) {
		if (p.matcher !== 'id') throw new Error(`${route}: describe the parameter matcher "${p.matcher}" of ${p.name} in openapi/registry.ts`);
		shape[p.name] = idParam.meta({ description: `Id of the ${PARAM_NAMES[p.name] ?? p.name}.`, example: 42 });
	}
	return z.object(shape);
}

/** The configured limits the description states (they are runtime settings). */
export interface DescriptionLimits {
	uploadMaxBytes: number;
	bodyMaxBytes: number;
	/** Requests a minute one API token may make. */
	tokenRequestsPerMinute: number;
	/** The scripted upload route's body cap, in words. */
	uploadBodyDescription: string;
}

const STATE_CHANGING: readonly HttpMethod[] = ['post', 'put', 'patch', 'delete'];

/** Roles whose grants include a permission, for the description of who may call. */
export function rolesAllowed(permission: Permission): string[] {
	return ROLES.filter((r) => roleAllows(r, permission));
}

const everyRoleMay = (permission: Permission) => rolesAllowed(permission).length === ROLES.length;

/** Every refusal of an operation, with what it means there: the common ones, then its own. */
export function refusalsOf(op: ApiOperation, bodyLimitBytes: number, limits: Pick<DescriptionLimits, 'tokenRequestsPerMinute'>): Partial<Record<ErrorStatus, string>> {
	const out: Partial<Record<ErrorStatus, string>> = {};
	const permission = op.access === 'public' ? null : op.access;
	if (permission) {
		out[401] =
			'Not signed in: no session cookie or bearer token, or a session that has ended. A token that is not valid, has expired, was revoked or ended with its account\'s sessions is answered with code invalid_token and a WWW-Authenticate header saying which.';
	}
	const reasons403: string[] = [];
	if (permission && !everyRoleMay(permission)) reasons403.push(`your role does not allow this (it needs ${permission}: ${rolesAllowed(permission).join(', ')})`);
	if (permission) {
		const scope = scopeFor(permission);
		reasons403.push(scope ? `the token lacks the "${scope}" scope` : 'the request came with a token (no scope opens this)');
	}
	if (STATE_CHANGING.includes(op.method)) reasons403.push('a change sent with cookies from another site, or with cookies and no Origin header');
	if (reasons403.length) out[403] = `Refused: ${reasons403.join('; or ')}.`;
	if (routeParams(op.route).length > 0) out[404] = 'No such thing, or it lies outside your reach (the same answer, on purpose).';
	if (op.body) out[413] = `The request body is larger than the ${describeBytes(bodyLimitBytes)} allowed here (code too_large).`;
	if (permission) out[429] = `More than ${limits.tokenRequestsPerMinute} requests a minute with one API token (code rate_limited); Retry-After says in how many seconds to try again.`;
	if (permission) out[503] = 'The database or object storage is briefly unreachable (code unavailable); try again.';
	return { ...out, ...op.errors };
}

export function describeBytes(n: number): string {
	const mib = n / (1024 * 1024);
	return mib >= 1 ? `${Number.isInteger(mib) ? mib : mib.toFixed(1)} MiB` : `${Math.ceil(n / 1024)} KiB`;
}

/** The OpenAPI responses for an operation's refusals, all in the Problem JSON shape. */
export function refusalResponses(refusals: Partial<Record<ErrorStatus, string>>): Record<string, ZodOpenApiResponseObject> {
	const out: Record<string, ZodOpenApiResponseObject> = {};
	for (const [status, description] of Object.entries(refusals)) {
		out[status] = { description: description!, content: { 'application/json': { schema: problemSchema } } };
	}
	return out;
}

