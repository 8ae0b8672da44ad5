// JSON API routes: bodies validated with zod, refusals answered as { message, code?, errors? }.
import { json } from '@sveltejs/kit';
import type { z } from 'zod';
import { fieldErrors } from './forms';
import { Problem } from './problem';
import { problemFromDbError } from './db-errors';

/** Parse a JSON body: 400 when it is not JSON, 422 with field errors when it is the wrong shape. */
export async function parseJsonBody<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
	let raw: unknown;
	try {
		raw = await request.json();
	} catch {
		throw new Problem(400, 'The request body must be JSON.', { code: 'not_json' });
	}
	return parseJson(schema, raw);
}

/** Check parsed JSON (or query values) against a schema: 422 with field errors when wrong. */
export function parseJson<S extends z.ZodType>(schema: S, raw: unknown): z.infer<S> {
	const parsed = schema.safeParse(raw);
	if (!parsed.success) throw new Problem(422, 'Some fields are not valid.', { code: 'invalid', details: { errors: fieldErrors(parsed.error) } });
	return parsed.data;
}

/** The JSON answer for a problem. */
export function problemResponse(p: Problem): Response {
	const body: Record<string, unknown> = { message: p.message, ...p.details };
	if (p.code) body.code = p.code;
	if (p.field && body.errors === undefined) body.errors = { [p.field]: p.message };
	return json(body, { status: p.status });
}

/** Turn refusals into JSON answers; anything else goes to handleError as a 500. */
export async function answer(work: () => Promise<Response>): Promise<Response> {
	try {
		return await work();
	} catch (e) {
		const p = e instanceof Problem ? e : problemFromDbError(e);
		if (p) return problemResponse(p);
		throw e;
	}
}
