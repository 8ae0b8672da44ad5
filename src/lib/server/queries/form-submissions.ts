// The one-time keys of creating forms (see migrations/…_form_submissions.ts).
import type { Knex } from 'knex';
import { isDuplicateKey } from '../db-errors';
import { readJson } from '../json-column';

/** What an action answered: a value to return again, or where it redirected. */
export type FormOutcome = { kind: 'value'; value: unknown } | { kind: 'redirect'; status: number; location: string };

/** A submission is forgotten after a day: a page left open longer gets a fresh key on reload. */
const KEEP_HOURS = 24;

/** Claim a key for this action: true for the first submission, false when it was sent before. */
export async function claimFormKey(k: Knex, formKey: string, action: string): Promise<boolean> {
	try {
		await k('form_submissions').insert({ form_key: formKey, action });
		return true;
	} catch (e) {
		if (isDuplicateKey(e)) return false;
		throw e;
	}
}

/** The recorded outcome; `undefined` when the key is not (or no longer) claimed, `null` while pending. */
export async function formOutcome(k: Knex, formKey: string, action: string): Promise<FormOutcome | null | undefined> {
	const row = await k('form_submissions').where({ form_key: formKey, action }).first('outcome');
	if (!row) return undefined;
	return row.outcome === null ? null : readJson<FormOutcome>(row.outcome);
}

export async function recordFormOutcome(k: Knex, formKey: string, action: string, outcome: FormOutcome): Promise<void> {
	await k('form_submissions').where({ form_key: formKey, action }).update({ outcome: JSON.stringify(outcome) });
}

/** Give the key back (the submission was refused or failed), so the corrected form can be sent. */
export async function releaseFormKey(k: Knex, formKey: string, action: string): Promise<void> {
	await k('form_submissions').where({ form_key: formKey, action }).delete();
}

export async function forgetOldFormKeys(k: Knex): Promise<void> {
	await k('form_submissions').where('created_at', '<', k.raw('NOW() - INTERVAL ? HOUR', [KEEP_HOURS])).limit(500).delete();
}
