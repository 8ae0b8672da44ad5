// Helpers for JSON API routes: bodies validated with zod, errors as { message, errors }.
import { error, json } from '@sveltejs/kit';
import type { z } from 'zod';
import { fieldErrors } from './forms';
import { CaptureProblem } from './captures/service';
import { StorageUnavailableError } from './storage';

export class ApiError extends Error {
	constructor(
		readonly status: number,
		message: string,
		readonly body: Record<string, unknown> = {}
	) {
		super(message);
	}
}

/** Parse a JSON body: 400 when it is not JSON, 422 with field errors when it is the wrong shape. */
export async function parseJsonBody<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
	let raw: unknown;
	try {
		raw = await request.json();
	} catch {
		throw new ApiError(400, 'The request body must be JSON.');
	}
	const parsed = schema.safeParse(raw);
	if (!parsed.success) throw new ApiError(422, 'Some fields are not valid.', { errors: fieldErrors(parsed.error) });
	return parsed.data;
}

/** Turn expected failures into JSON answers; anything else goes to handleError as a 500. */
export async function answer(work: () => Promise<Response>): Promise<Response> {
	try {
		return await work();
	} catch (e) {
		if (e instanceof ApiError) return json({ message: e.message, ...e.body }, { status: e.status });
		if (e instanceof CaptureProblem) return json({ message: e.message, ...e.details }, { status: e.status });
		if (e instanceof StorageUnavailableError) return json({ message: e.message }, { status: 503 });
		throw e;
	}
}

export { error };
