// The OpenAPI 3.1 document of the API, made from the registry's entries by zod-openapi. Served at
// /api/openapi.json and read by the page /developers/api.
import { createDocument, type ZodOpenApiObject, type ZodOpenApiOperationObject, type ZodOpenApiPathsObject } from 'zod-openapi';
import { bodyLimitFor, uploadBodyBytes } from '../body-limit';
import { config, type AppConfig } from '../config';
import { apiOperations } from './operations';
import { SCOPE_LABELS, TOKEN_SCOPES, type Permission } from '../../roles';
import { describeBytes, openApiPath, pathParamsSchema, refusalResponses, refusalsOf, rolesAllowed, RESOURCES, scopeFor, type ApiOperation, type DescriptionLimits } from './registry';

export const API_VERSION = '1.0.0';

/** The Auth.js session cookie: the plain name over http, `__Secure-` prefixed over https. */
const SESSION_COOKIE = 'authjs.session-token';

type Settings = Pick<AppConfig, 'PUBLIC_BASE_URL' | 'UPLOAD_MAX_BYTES' | 'BODY_MAX_BYTES' | 'API_TOKEN_REQUESTS_PER_MINUTE'>;

function limitsOf(c: Settings): DescriptionLimits {
	return { uploadMaxBytes: c.UPLOAD_MAX_BYTES, bodyMaxBytes: c.BODY_MAX_BYTES, tokenRequestsPerMinute: c.API_TOKEN_REQUESTS_PER_MINUTE, uploadBodyDescription: describeBytes(uploadBodyBytes(c)) };
}

/** The role and token facts of an operation, as extensions the readable page shows. */
export interface AccessExtensions {
	'x-permission': string;
	'x-roles': string[];
	'x-token-scope': string | null;
}

function operationObject(op: ApiOperation, c: Settings): ZodOpenApiOperationObject & AccessExtensions {
	const path = pathParamsSchema(op.route);
	const permission: Permission | null = op.access === 'public' ? null : op.access;
	const scope = permission && scopeFor(permission);
	const refusals = refusalsOf(op, bodyLimitFor(op.route, c), limitsOf(c));
	return {
		operationId: op.operationId,
		tags: [op.resource],
		summary: op.summary,
		description: op.description,
		security: permission ? [{ sessionCookie: [] }, ...(scope ? [{ bearerToken: [scope] }] : [])] : [],
		requestParams: { ...(path && { path }), ...(op.query && { query: op.query }), ...(op.headers && { header: op.headers }) },
		...(op.body && {
			requestBody: {
				required: true,
				description: op.body.description,
				content: Object.fromEntries(Object.entries(op.body.content).map(([type, schema]) => [type, { schema }]))
			}
		}),
		responses: { ...op.responses, ...refusalResponses(refusals) },
		'x-permission': op.access,
		'x-roles': permission ? rolesAllowed(permission) : [],
		'x-token-scope': scope ?? null
	};
}

const INTRODUCTION = (c: Settings) => `The JSON API of Ringdown, for scripts and for the portal's own pages.

**Signing in.** Every operation except this description needs either the session cookie the browser gets at sign-in, or a personal API token sent as \`Authorization: Bearer rdt_…\`. A user makes tokens on their account page, with a name, an expiry and one or more scopes — ${TOKEN_SCOPES.map((s) => `\`${s}\` (${SCOPE_LABELS[s].toLowerCase()})`).join(', ')} — and sees each token once. A token acts with its user's role and reach, narrowed to its scopes, and makes at most ${c.API_TOKEN_REQUESTS_PER_MINUTE} requests a minute; it stops working when it expires or is revoked, and when its user's sessions are ended (a new password, signing out everywhere, leaving the organization).

**Who may.** Each operation names the permission it checks and the roles that have it. Anything outside your reach answers 404, whether it exists or not; what you can see but your role may not change answers 403.

**Refusals** are JSON: \`{ "message": "…", "code": "…", "errors": { "field": "…" } }\` — \`message\` for people, \`code\` for scripts, \`errors\` per field of the body. Bad JSON is 400 (\`not_json\`), a body of the wrong shape 422 (\`invalid\`).

**Limits.** Request bodies are capped at ${describeBytes(c.BODY_MAX_BYTES)}, except the scripted upload (${describeBytes(uploadBodyBytes(c))}); a larger one is answered 413 before it is read. Recordings go to object storage directly (announce, PUT, confirm) or through the upload route; each file is at most ${describeBytes(c.UPLOAD_MAX_BYTES)}. A POST, PUT, PATCH or DELETE that carries cookies must come with this site's \`Origin\`; requests without cookies (scripts with a token) need none. While the database or object storage cannot be reached, answers are 503 with \`code: "unavailable"\`: try again shortly.`;

/** The OpenAPI document for these settings. */
export function buildApiDescription(c: Settings): ReturnType<typeof createDocument> {
	const paths: ZodOpenApiPathsObject = {};
	for (const op of apiOperations(limitsOf(c))) {
		const path = openApiPath(op.route);
		paths[path] ??= {};
		if (paths[path][op.method]) throw new Error(`${op.method.toUpperCase()} ${path} is described twice`);
		paths[path][op.method] = operationObject(op, c);
	}
	const document: ZodOpenApiObject = {
		openapi: '3.1.0',
		info: { title: 'Ringdown API', version: API_VERSION, description: INTRODUCTION(c) },
		servers: [{ url: c.PUBLIC_BASE_URL, description: 'This installation' }],
		tags: RESOURCES.map((r) => ({ name: r.name, description: r.description })),
		paths,
		components: {
			securitySchemes: {
				sessionCookie: {
					type: 'apiKey',
					in: 'cookie',
					name: SESSION_COOKIE,
					description: `The browser's session, set by signing in on /signin (named __Secure-${SESSION_COOKIE} over https). Lasts 12 hours from sign-in; ends at sign-out.`
				},
				bearerToken: {
					type: 'http',
					scheme: 'bearer',
					bearerFormat: 'rdt_ followed by 43 base64url characters',
					description: `A personal API token from the account page, sent as Authorization: Bearer rdt_…. Each operation names the scope it needs (${TOKEN_SCOPES.join(', ')}); refused with 401 and a WWW-Authenticate header when not valid, expired or revoked.`
				}
			}
		}
	};
	return createDocument(document);
}

let cached: { key: string; document: ReturnType<typeof createDocument> } | null = null;

/** The document of the running app (made once per settings). */
export function apiDescription(c: Settings = config()): ReturnType<typeof createDocument> {
	const key = JSON.stringify([c.PUBLIC_BASE_URL, c.UPLOAD_MAX_BYTES, c.BODY_MAX_BYTES, c.API_TOKEN_REQUESTS_PER_MINUTE]);
	if (cached?.key !== key) cached = { key, document: buildApiDescription(c) };
	return cached.document;
}
