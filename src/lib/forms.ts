// The formId convention, shared by server and pages. Every form that can fail carries a hidden
// `formId` field (`<input type="hidden" name="formId" value="band-12">`); a failed action answers
// with that id, so a page with many forms shows the failure beside the one that was sent.

export const FORM_ID_FIELD = 'formId';

/** The hidden one-time key of a creating form (`FormKey.svelte`): the server acts on it once. */
export const FORM_KEY_FIELD = 'formKey';

/** 128 random bits as 32 hex digits (`crypto.randomUUID` needs a secure context; this does not). */
export function newFormKey(): string {
	const bytes = crypto.getRandomValues(new Uint8Array(16));
	return Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
}

export type FieldErrors = Record<string, string>;

export interface FormFailure {
	formId: string | null;
	values: Record<string, string>;
	errors: FieldErrors;
	message?: string;
}

/** The failure of the form with this id, if the last action that failed was that form's. */
export function failureOf(form: unknown, formId: string): FormFailure | null {
	const f = form as Partial<FormFailure> | null | undefined;
	return f && typeof f === 'object' && f.formId === formId && f.errors !== undefined ? (f as FormFailure) : null;
}
