// HTTP validators of a capture's stored result, so a browser that has it already is answered
// "not modified" without the result being read again.
import { db } from '../db';
import { analysisStamp } from '../queries/analyses';

/** A strong entity tag of the capture's stored result, or undefined when it has none. */
export async function analysisEntityTag(captureId: number): Promise<string | undefined> {
	const stamp = await analysisStamp(db(), captureId);
	return stamp && `"a${stamp.replace(/[^\w.-]/g, '_')}"`;
}

/** Whether an If-None-Match header names this tag (a list, or `*`). */
export function matchesTag(ifNoneMatch: string | null, tag: string): boolean {
	if (!ifNoneMatch) return false;
	return ifNoneMatch.split(',').some((t) => {
		const v = t.trim();
		return v === '*' || v === tag || v === `W/${tag}`;
	});
}
