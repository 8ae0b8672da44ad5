// Creating forms are sent once: each carries a one-time key (`FormKey.svelte`), and a second
// submission with the same key — a double click, a browser resending, a retry after a slow answer —
// waits for the first and gets its answer (the same redirect, the same value) instead of creating
// the thing again. A refused or failed submission gives its key back, so the corrected form goes.
import { isActionFailure, isRedirect, redirect } from '@sveltejs/kit';
import { db } from './db';
import { conflict } from './problem';
import { claimFormKey, forgetOldFormKeys, formOutcome, recordFormOutcome, releaseFormKey, type FormOutcome } from './queries/form-submissions';

/** The shape `FormKey.svelte` renders: 128 random bits as 32 hex digits. */
export const FORM_KEY_PATTERN = /^[0-9a-f]{32}$/;

const POLL_MS = 100;
/** How long a second submission waits for the first before it gives up (services answer well within it). */
const WAIT_MS = 15_000;

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function waitForOutcome(formKey: string, action: string): Promise<FormOutcome | undefined> {
	for (const deadline = Date.now() + WAIT_MS; Date.now() < deadline; await sleep(POLL_MS)) {
		const outcome = await formOutcome(db(), formKey, action);
		if (outcome !== null) return outcome;
	}
	throw conflict('This form is still being sent. Wait a moment, then reload the page to see the result.', { code: 'form_pending' });
}

function replay<R>(outcome: FormOutcome): R {
	if (outcome.kind === 'redirect') redirect(outcome.status as 303, outcome.location);
	return outcome.value as R;
}

/** Run `work` once per form key and action; later submissions of the key replay its outcome. */
export async function submitOnce<R>(formKey: string, action: string, work: () => Promise<R>): Promise<R> {
	const k = db();
	while (!(await claimFormKey(k, formKey, action))) {
		const outcome = await waitForOutcome(formKey, action);
		// The first submission failed and gave the key back: this one goes ahead.
		if (outcome !== undefined) return replay<R>(outcome);
	}
	void forgetOldFormKeys(k).catch(() => {});
	try {
		const value = await work();
		if (isActionFailure(value)) await releaseFormKey(k, formKey, action);
		else await recordFormOutcome(k, formKey, action, { kind: 'value', value });
		return value;
	} catch (e) {
		if (isRedirect(e)) await recordFormOutcome(k, formKey, action, { kind: 'redirect', status: e.status, location: e.location });
		else await releaseFormKey(k, formKey, action);
		throw e;
	}
}
