// `use:sendOnce` for creating forms: SvelteKit's `enhance`, with the form's buttons disabled while
// it is being sent and its one-time key (`FormKey.svelte`) renewed after a success, so the next
// entry on the same page is a new one. The server refuses a repeated key either way.
import { enhance } from '$app/forms';
import type { SubmitFunction } from '@sveltejs/kit';
import { FORM_KEY_FIELD, newFormKey } from '$lib/forms';

export function sendOnce(form: HTMLFormElement, submit?: SubmitFunction) {
	return enhance(form, (input) => {
		const buttons = Array.from(form.querySelectorAll<HTMLButtonElement | HTMLInputElement>('button:not([type="button"]), input[type="submit"]'));
		const release = () => {
			for (const b of buttons) b.disabled = false;
			form.removeAttribute('aria-busy');
		};
		for (const b of buttons) b.disabled = true;
		form.setAttribute('aria-busy', 'true');
		const cancel = input.cancel;
		input.cancel = () => {
			release();
			cancel();
		};
		const custom = submit?.(input);
		return async (after) => {
			try {
				const then = await custom;
				if (typeof then === 'function') await then(after);
				else await after.update();
				if (after.result.type === 'success' || after.result.type === 'redirect') {
					const key = form.querySelector<HTMLInputElement>(`input[name="${FORM_KEY_FIELD}"]`);
					if (key) key.value = newFormKey();
				}
			} finally {
				release();
			}
		};
	});
}
