// The readable page of the API description, made from the OpenAPI document itself (so the page
// and /api/openapi.json cannot disagree): operations grouped by resource, each with its access,
// parameters, body, answers and refusals as rows of text, and the named shapes at the end.

/** The parts of a JSON Schema (OpenAPI 3.1) this page reads. */
interface Schema {
	$ref?: string;
	type?: string | string[];
	format?: string;
	description?: string;
	enum?: unknown[];
	const?: unknown;
	default?: unknown;
	properties?: Record<string, Schema>;
	required?: string[];
	additionalProperties?: boolean | Schema;
	items?: Schema;
	anyOf?: Schema[];
	oneOf?: Schema[];
	allOf?: Schema[];
	minimum?: number;
	maximum?: number;
	exclusiveMinimum?: number;
	exclusiveMaximum?: number;
	minLength?: number;
	maxLength?: number;
	pattern?: string;
	contentEncoding?: string;
}

interface Parameter {
	name: string;
	in: string;
	required?: boolean;
	description?: string;
	schema?: Schema;
}

interface Media {
	schema?: Schema;
}

interface Operation {
	operationId: string;
	summary?: string;
	description?: string;
	tags?: string[];
	security?: Record<string, string[]>[];
	parameters?: Parameter[];
	requestBody?: { description?: string; content: Record<string, Media> };
	responses: Record<string, { description: string; content?: Record<string, Media>; headers?: Record<string, { description?: string; schema?: Schema }> }>;
	'x-permission'?: string;
	'x-roles'?: string[];
	'x-token-scope'?: string | null;
}

export interface ApiDocument {
	info: { title: string; version: string; description?: string };
	servers?: { url: string }[];
	tags?: { name: string; description?: string }[];
	paths: Record<string, Record<string, Operation>>;
	components?: { schemas?: Record<string, Schema>; securitySchemes?: Record<string, { type: string; scheme?: string; in?: string; name?: string; bearerFormat?: string; description?: string }> };
}

/** One line of a field table. `shape` names a shape of the Shapes section the type refers to. */
export interface FieldRow {
	name: string;
	type: string;
	shape: string | null;
	required: boolean;
	description: string;
}

export interface BodyView {
	contentType: string;
	/** The named shape, when the whole body is one. */
	shape: string | null;
	fields: FieldRow[];
}

export interface OperationView {
	anchor: string;
	method: string;
	path: string;
	summary: string;
	description: string;
	access: { public: true } | { public: false; permission: string; roles: string[]; tokenScope: string | null };
	parameters: (FieldRow & { in: string })[];
	body: { description: string; media: BodyView[] } | null;
	responses: { status: string; description: string; media: BodyView[]; headers: { name: string; description: string }[] }[];
	errors: { status: string; description: string }[];
}

export type Inline = { kind: 'text' | 'strong' | 'code'; text: string };

export interface ApiPageView {
	title: string;
	version: string;
	server: string | null;
	introduction: Inline[][];
	security: { name: string; kind: string; description: string }[];
	resources: { name: string; anchor: string; description: string; operations: OperationView[] }[];
	shapes: { name: string; anchor: string; description: string; fields: FieldRow[] }[];
	counts: { paths: number; operations: number };
}

export const METHOD_ORDER = ['get', 'post', 'put', 'patch', 'delete'];

const refName = (ref: string) => ref.split('/').pop()!;

/** `**bold**` and `` `code` `` inside a paragraph, the rest as text. */
export function inlineMarkup(paragraph: string): Inline[] {
	const out: Inline[] = [];
	const re = /\*\*([^*]+)\*\*|`([^`]+)`/g;
	let at = 0;
	for (const m of paragraph.matchAll(re)) {
		if (m.index > at) out.push({ kind: 'text', text: paragraph.slice(at, m.index) });
		out.push(m[1] !== undefined ? { kind: 'strong', text: m[1] } : { kind: 'code', text: m[2] });
		at = m.index + m[0].length;
	}
	if (at < paragraph.length) out.push({ kind: 'text', text: paragraph.slice(at) });
	return out;
}

const isNull = (s: Schema) => s.type === 'null';

/** The schema without its `or null`, and whether it had one. */
function unNull(s: Schema): { schema: Schema; nullable: boolean } {
	const alternatives = s.anyOf ?? s.oneOf;
	if (alternatives && alternatives.some(isNull)) {
		const rest = alternatives.filter((a) => !isNull(a));
		if (rest.length === 1) return { schema: { ...rest[0], description: s.description ?? rest[0].description, default: s.default ?? rest[0].default }, nullable: true };
	}
	if (Array.isArray(s.type) && s.type.includes('null')) {
		const rest = s.type.filter((t) => t !== 'null');
		return { schema: { ...s, type: rest.length === 1 ? rest[0] : rest }, nullable: true };
	}
	return { schema: s, nullable: false };
}

const MAX_SAFE = Number.MAX_SAFE_INTEGER;

function numberRange(s: Schema): string {
	const lo = s.exclusiveMinimum !== undefined ? `> ${s.exclusiveMinimum}` : s.minimum !== undefined && s.minimum > -MAX_SAFE ? `≥ ${s.minimum}` : '';
	const hi = s.exclusiveMaximum !== undefined ? `< ${s.exclusiveMaximum}` : s.maximum !== undefined && s.maximum < MAX_SAFE ? `≤ ${s.maximum}` : '';
	if (s.minimum !== undefined && s.maximum !== undefined && s.maximum < MAX_SAFE && s.minimum > -MAX_SAFE) return `${s.minimum} to ${s.maximum}`;
	return [lo, hi].filter(Boolean).join(', ');
}

/** The type of a schema in words: "integer > 0", "one of impulse, sweep", "array of Capture". */
export function typeText(raw: Schema): { text: string; shape: string | null } {
	const { schema: s, nullable } = unNull(raw);
	const orNull = (t: { text: string; shape: string | null }) => (nullable ? { ...t, text: `${t.text} or null` } : t);
	if (s.$ref) return orNull({ text: refName(s.$ref), shape: refName(s.$ref) });
	if (s.const !== undefined) return orNull({ text: JSON.stringify(s.const), shape: null });
	if (s.enum) return orNull({ text: `one of ${s.enum.map(String).join(', ')}`, shape: null });
	const type = Array.isArray(s.type) ? s.type.join(' or ') : s.type;
	if (type === 'array') {
		const inner = s.items ? typeText(s.items) : { text: 'anything', shape: null };
		return orNull({ text: `array of ${inner.text}`, shape: inner.shape });
	}
	if (type === 'string') {
		if (s.format === 'binary' || s.contentEncoding === 'binary') return orNull({ text: 'file', shape: null });
		const parts = [s.format, s.pattern ? `matching ${s.pattern}` : '', s.minLength !== undefined && s.maxLength !== undefined ? `${s.minLength}–${s.maxLength} characters` : s.maxLength !== undefined ? `at most ${s.maxLength} characters` : s.minLength ? `at least ${s.minLength} character${s.minLength === 1 ? '' : 's'}` : ''].filter(Boolean);
		return orNull({ text: parts.length ? `string, ${parts.join(', ')}` : 'string', shape: null });
	}
	if (type === 'integer' || type === 'number') {
		const range = numberRange(s);
		return orNull({ text: range ? `${type} ${range}` : type, shape: null });
	}
	if (type === 'object' || s.properties) {
		if (!s.properties && s.additionalProperties && typeof s.additionalProperties === 'object') {
			const inner = typeText(s.additionalProperties);
			return orNull({ text: Object.keys(s.additionalProperties).length ? `map of names to ${inner.text}` : 'object', shape: inner.shape });
		}
		return orNull({ text: 'object', shape: null });
	}
	return orNull({ text: type ?? 'any JSON', shape: null });
}

function describe(s: Schema): string {
	const { schema } = unNull(s);
	const parts = [s.description ?? schema.description ?? ''];
	const dflt = s.default ?? schema.default;
	if (dflt !== undefined) parts.push(`Default ${JSON.stringify(dflt)}.`);
	return parts.filter(Boolean).join(' ');
}

/** Rows for an object's properties, inline objects and arrays of them opened with dotted names. */
export function fieldRows(schema: Schema, prefix = '', depth = 0): FieldRow[] {
	const { schema: s } = unNull(schema);
	if (!s.properties) return [];
	const required = new Set(s.required ?? []);
	const rows: FieldRow[] = [];
	for (const [key, prop] of Object.entries(s.properties)) {
		const t = typeText(prop);
		rows.push({ name: prefix + key, type: t.text, shape: t.shape, required: required.has(key), description: describe(prop) });
		if (depth >= 3) continue;
		const inner = unNull(prop).schema;
		if (inner.properties) rows.push(...fieldRows(inner, `${prefix}${key}.`, depth + 1));
		else if (inner.type === 'array' && inner.items && !inner.items.$ref && unNull(inner.items).schema.properties) rows.push(...fieldRows(inner.items, `${prefix}${key}[].`, depth + 1));
	}
	return rows;
}

/** A body's fields; a named shape is linked, and opened here too when `open` (request bodies). */
function bodyView(contentType: string, media: Media, components: Record<string, Schema>, open: boolean): BodyView {
	const schema = media.schema ?? {};
	const shape = schema.$ref ? refName(schema.$ref) : null;
	if (!shape) return { contentType, shape, fields: fieldRows(schema) };
	return { contentType, shape, fields: open && components[shape] ? fieldRows(components[shape]) : [] };
}

const anchorOf = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');

function operationView(path: string, method: string, op: Operation, components: Record<string, Schema>): OperationView {
	const access: OperationView['access'] =
		op['x-permission'] === 'public' || (op.security?.length === 0 && !op['x-permission'])
			? { public: true }
			: { public: false, permission: op['x-permission'] ?? '', roles: op['x-roles'] ?? [], tokenScope: op['x-token-scope'] ?? null };
	const responses: OperationView['responses'] = [];
	const errors: OperationView['errors'] = [];
	for (const [status, r] of Object.entries(op.responses)) {
		if (Number(status) >= 400) errors.push({ status, description: r.description });
		else
			responses.push({
				status,
				description: r.description,
				media: Object.entries(r.content ?? {}).map(([type, m]) => bodyView(type, m, components, false)),
				headers: Object.entries(r.headers ?? {}).map(([name, h]) => ({ name, description: h.description ?? h.schema?.description ?? '' }))
			});
	}
	return {
		anchor: op.operationId,
		method: method.toUpperCase(),
		path,
		summary: op.summary ?? '',
		description: op.description ?? '',
		access,
		parameters: (op.parameters ?? []).map((p) => {
			const t = p.schema ? typeText(p.schema) : { text: 'string', shape: null };
			return { in: p.in, name: p.name, type: t.text, shape: t.shape, required: Boolean(p.required), description: p.description ?? (p.schema ? describe(p.schema) : '') };
		}),
		body: op.requestBody ? { description: op.requestBody.description ?? '', media: Object.entries(op.requestBody.content).map(([type, m]) => bodyView(type, m, components, true)) } : null,
		responses,
		errors
	};
}

/** The page's view of an OpenAPI document. */
export function apiPageView(doc: ApiDocument): ApiPageView {
	const byTag = new Map<string, OperationView[]>();
	let operations = 0;
	for (const [path, item] of Object.entries(doc.paths)) {
		for (const method of METHOD_ORDER) {
			const op = item[method];
			if (!op) continue;
			operations++;
			const tag = op.tags?.[0] ?? 'Other';
			if (!byTag.has(tag)) byTag.set(tag, []);
			byTag.get(tag)!.push(operationView(path, method, op, doc.components?.schemas ?? {}));
		}
	}
	const tags = [...(doc.tags ?? []), ...[...byTag.keys()].filter((t) => !doc.tags?.some((d) => d.name === t)).map((name) => ({ name, description: '' }))];
	const schemes = doc.components?.securitySchemes ?? {};
	return {
		title: doc.info.title,
		version: doc.info.version,
		server: doc.servers?.[0]?.url ?? null,
		introduction: (doc.info.description ?? '')
			.split(/\n\s*\n/)
			.map((p) => p.trim())
			.filter(Boolean)
			.map(inlineMarkup),
		security: Object.entries(schemes).map(([name, s]) => ({
			name,
			kind: s.type === 'http' ? `HTTP ${s.scheme ?? ''} (${s.bearerFormat ?? 'token'})`.replace(/\s+/g, ' ') : s.type === 'apiKey' ? `${s.in} "${s.name}"` : s.type,
			description: s.description ?? ''
		})),
		resources: tags
			.filter((t) => byTag.has(t.name))
			.map((t) => ({ name: t.name, anchor: anchorOf(t.name), description: t.description ?? '', operations: byTag.get(t.name)! })),
		shapes: Object.entries(doc.components?.schemas ?? {})
			.sort(([a], [b]) => a.localeCompare(b))
			.map(([name, s]) => ({ name, anchor: `shape-${name}`, description: s.description ?? '', fields: fieldRows(s) })),
		counts: { paths: Object.keys(doc.paths).length, operations }
	};
}
