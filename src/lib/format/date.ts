// Dates and times for people. Written in UTC, so the server's page and the browser's agree.

const DATE = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeZone: 'UTC' });
const TIME = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZone: 'UTC' });

/** "4 Dec 2026". */
export function formatDate(when: Date | string): string {
	return DATE.format(new Date(when));
}

/** "4 Dec 2026, 09:05 UTC". */
export function formatDateTime(when: Date | string): string {
	const d = new Date(when);
	return `${DATE.format(d)}, ${TIME.format(d)} UTC`;
}
