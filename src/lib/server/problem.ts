// The one error type of the domain: a refusal a person can act on. Services throw it; routes map
// it once — `answer()` for API routes, `formAction()` for form actions. Anything else is a bug and
// goes to `handleError` as a 500.

export interface ProblemOptions {
	/** The form field or JSON property the refusal is about, shown beside it. */
	field?: string;
	/** A stable machine-readable name for scripts (`duplicate`, `storage_unavailable`, …). */
	code?: string;
	/** Extra JSON for API clients (for example the id of the capture a duplicate repeats). */
	details?: Record<string, unknown>;
}

export class Problem extends Error {
	readonly field?: string;
	readonly code?: string;
	readonly details: Record<string, unknown>;

	constructor(
		readonly status: number,
		message: string,
		options: ProblemOptions = {}
	) {
		super(message);
		this.name = 'Problem';
		this.field = options.field;
		this.code = options.code;
		this.details = options.details ?? {};
	}
}

/** The thing asked for does not exist here (or not for this caller: the same answer, on purpose). */
export function notFound(message = 'Not found.', options: ProblemOptions = {}): Problem {
	return new Problem(404, message, options);
}

/** The input is understood but cannot be accepted as it is. */
export function invalid(message: string, field?: string, options: Omit<ProblemOptions, 'field'> = {}): Problem {
	return new Problem(400, message, { ...options, field });
}

/** The change clashes with what is already stored. */
export function conflict(message: string, options: ProblemOptions = {}): Problem {
	return new Problem(409, message, { code: 'conflict', ...options });
}

/** A dependency (database, object storage) is briefly unreachable. */
export function unavailable(message: string, cause?: unknown): Problem {
	const p = new Problem(503, message, { code: 'unavailable' });
	p.cause = cause;
	return p;
}
