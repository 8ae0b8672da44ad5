import { fail, type ActionFailure } from '@sveltejs/kit';
import type { z } from 'zod';

export type FieldErrors = Record<string, string>;

export interface FormFailure {
	values: Record<string, string>;
	errors: FieldErrors;
	message?: string;
}

const SECRET_FIELDS = /password|confirm|token/i;

/** Form values safe to echo back to the page (never passwords or tokens). */
function echo(formData: FormData): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [k, v] of formData) if (typeof v === 'string' && !SECRET_FIELDS.test(k)) values[k] = v;
	return values;
}

export function fieldErrors(error: z.ZodError): FieldErrors {
	const errors: FieldErrors = {};
	for (const issue of error.issues) {
		const key = issue.path.join('.') || 'form';
		errors[key] ??= issue.message;
	}
	return errors;
}

/**
 * Parse a form with a zod schema: the data, or a `fail(400)` carrying field errors and the
 * echoed values, ready to return from an action.
 */
export function parseForm<S extends z.ZodType>(
	schema: S,
	formData: FormData
): { ok: true; data: z.infer<S> } | { ok: false; failure: ActionFailure<FormFailure> } {
	const raw = Object.fromEntries([...formData].filter(([, v]) => typeof v === 'string'));
	const parsed = schema.safeParse(raw);
	if (parsed.success) return { ok: true, data: parsed.data };
	return { ok: false, failure: fail(400, { values: echo(formData), errors: fieldErrors(parsed.error) }) };
}

export function formFail(status: number, formData: FormData, message: string, errors: FieldErrors = {}) {
	return fail(status, { values: echo(formData), errors, message });
}
