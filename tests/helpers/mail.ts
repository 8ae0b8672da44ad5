import { MAIL_SINK_URL } from './env';

export interface SunkMessage {
	id: number;
	to: string[];
	subject: string;
	text: string;
}

/** Wait until the sink holds a message to `to` whose subject matches, and return it. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 15_000, also: (m: SunkMessage) => boolean = () => true): Promise<SunkMessage> {
	const until = Date.now() + timeoutMs;
	for (;;) {
		const res = await fetch(`${MAIL_SINK_URL}/api/messages?to=${encodeURIComponent(to)}`);
		const list = (await res.json()) as SunkMessage[];
		const hit = list.reverse().find((m) => subject.test(m.subject) && also(m));
		if (hit) return hit;
		if (Date.now() > until) throw new Error(`No mail to ${to} matching ${subject} within ${timeoutMs} ms`);
		await new Promise((r) => setTimeout(r, 200));
	}
}

export function firstLink(text: string): string {
	const m = text.match(/https?:\/\/\S+/);
	if (!m) throw new Error('The message has no link');
	return m[0];
}
