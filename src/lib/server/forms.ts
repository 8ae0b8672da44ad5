// Form actions: parse with zod, run the service, and map a refused change to `fail(status)`
// carrying the form's id, its field errors and the values to show again.
import { fail, type ActionFailure } from '@sveltejs/kit';
import type { z } from 'zod';
import { FORM_ID_FIELD, FORM_KEY_FIELD, type FieldErrors, type FormFailure } from '../forms';
import { FORM_KEY_PATTERN, submitOnce } from './form-once';
import { Problem } from './problem';
import { problemFromDbError } from './db-errors';

export type { FieldErrors, FormFailure };

const SECRET_FIELDS = /password|confirm|token|formKey/i;

/** Form values safe to echo back to the page (never passwords or tokens). */
function echo(formData: FormData): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [k, v] of formData) if (typeof v === 'string' && !SECRET_FIELDS.test(k)) values[k] = v;
	return values;
}

function formIdOf(formData: FormData): string | null {
	const v = formData.get(FORM_ID_FIELD);
	return typeof v === 'string' && v !== '' ? v : null;
}

export function fieldErrors(error: z.ZodError): FieldErrors {
	const errors: FieldErrors = {};
	for (const issue of error.issues) {
		const key = issue.path.join('.') || 'form';
		errors[key] ??= issue.message;
	}
	return errors;
}

export function formFail(status: number, formData: FormData, message: string | undefined, errors: FieldErrors = {}): ActionFailure<FormFailure> {
	return fail(status, { formId: formIdOf(formData), values: echo(formData), errors, message });
}

/**
 * Parse a form with a zod schema: the data, or a `fail(400)` carrying field errors and the
 * echoed values, ready to return from an action.
 */
export function parseForm<S extends z.ZodType>(
	schema: S,
	formData: FormData
): { ok: true; data: z.infer<S> } | { ok: false; failure: ActionFailure<FormFailure> } {
	const raw = Object.fromEntries([...formData].filter(([k, v]) => typeof v === 'string' && k !== FORM_ID_FIELD && k !== FORM_KEY_FIELD));
	const parsed = schema.safeParse(raw);
	if (parsed.success) return { ok: true, data: parsed.data };
	return { ok: false, failure: formFail(400, formData, undefined, fieldErrors(parsed.error)) };
}

/** A refused change as the form's failure; anything that is not a problem is thrown on. */
export function problemToFailure(e: unknown, formData: FormData): ActionFailure<FormFailure> {
	const p = e instanceof Problem ? e : problemFromDbError(e);
	if (!p) throw e;
	// Like the JSON answer: several fields at once in `details.errors`, else the one field named.
	const errors = (p.details.errors as FieldErrors | undefined) ?? (p.field ? { [p.field]: p.message } : {});
	return formFail(p.status, formData, p.message, errors);
}

/**
 * The body of a form action after `authorize()`: read and parse the form, run the service with
 * the parsed input, and answer with its result or the refusal. A `redirect()` inside `work`
 * passes through. A schema that depends on the form (its length unit) is given as a function of it.
 * A form carrying a one-time key (`FormKey.svelte`) is acted on once: a repeat gets the first answer.
 *
 *   return formAction(request, roomSchema, (input) => rooms.update(scope, roomId, input));
 */
export async function formAction<S extends z.ZodType, R>(
	request: Request,
	schema: S | ((formData: FormData) => S),
	work: (input: z.infer<S>, formData: FormData) => Promise<R>
): Promise<R | ActionFailure<FormFailure>> {
	const formData = await request.formData();
	const parsed = parseForm(typeof schema === 'function' ? schema(formData) : schema, formData);
	if (!parsed.ok) return parsed.failure;
	const formKey = formData.get(FORM_KEY_FIELD);
	const run = () => work(parsed.data, formData);
	try {
		if (typeof formKey !== 'string' || !FORM_KEY_PATTERN.test(formKey)) return await run();
		const url = new URL(request.url);
		return await submitOnce(formKey, url.pathname + url.search, run);
	} catch (e) {
		return problemToFailure(e, formData);
	}
}
