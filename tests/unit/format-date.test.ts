import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTime } from '../../src/lib/format';

describe('formatDate / formatDateTime', () => {
	it('write the day in UTC, whatever the machine’s zone', () => {
		expect(formatDate('2026-12-04T23:30:00Z')).toBe('4 Dec 2026');
		expect(formatDate(new Date('2027-01-01T00:00:00Z'))).toBe('1 Jan 2027');
		expect(formatDateTime('2026-12-04T09:05:59Z')).toBe('4 Dec 2026, 09:05 UTC');
		expect(formatDateTime('2026-12-04T00:00:00Z')).toBe('4 Dec 2026, 00:00 UTC');
	});
});
