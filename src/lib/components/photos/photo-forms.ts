// How the photo forms answer in the browser. They post to the visit's photo page
// (/sessions/[id]/photos), which redirects back without JavaScript; here a success refreshes the
// page's data in place and a refusal is shown beside the form that was sent.
import { invalidateAll } from '$app/navigation';
import type { ActionResult, SubmitFunction } from '@sveltejs/kit';

/** The message of a refused or failed answer, in the words the server chose. */
export function problemOf(result: ActionResult): string | null {
	if (result.type === 'failure') {
		const data = result.data as { message?: string; errors?: Record<string, string> } | undefined;
		return data?.message ?? Object.values(data?.errors ?? {})[0] ?? 'This was refused.';
	}
	if (result.type === 'error') return (result.error as { message?: string } | undefined)?.message ?? 'Something went wrong. Try again.';
	// A refusal before the route ran (the body limit) answers plain JSON, not an action result.
	const plain = result as unknown as { type?: string; message?: string };
	if (plain.type === undefined) return plain.message ?? 'The photo could not be sent.';
	return null;
}

interface Handlers {
	/** Before the form is sent: return a message to stop it. */
	check?: (data: FormData) => string | null;
	onProblem: (message: string | null) => void;
	onSending?: (sending: boolean) => void;
	/** After the change is stored and the page's data refreshed. */
	onDone?: (form: HTMLFormElement) => void;
}

export function photoSubmit(h: Handlers): SubmitFunction {
	return ({ formData, cancel }) => {
		const refused = h.check?.(formData) ?? null;
		h.onProblem(refused);
		if (refused) {
			cancel();
			return;
		}
		h.onSending?.(true);
		return async ({ result, formElement }) => {
			try {
				const problem = problemOf(result);
				h.onProblem(problem);
				if (problem === null) {
					await invalidateAll();
					h.onDone?.(formElement);
				}
			} finally {
				h.onSending?.(false);
			}
		};
	};
}
