import { describe, expect, it } from 'vitest';
import { sessionAnalysedMail } from '../../src/lib/server/messages';

const visit = { roomName: 'Attic listening room', condition: 'Before treatment', link: 'http://127.0.0.1/sessions/1' };

describe('the "visit analysed" e-mail', () => {
	it('counts only the captures that were analysed as analysed', () => {
		const mail = sessionAnalysedMail({ ...visit, analysed: 3, failed: 1 });
		expect(mail.subject).toBe('Attic listening room, Before treatment: 3 captures analysed, 1 failed');
		expect(mail.text).toContain('Analysed: 3');
		expect(mail.text).toMatch(/Failed: +1 — open the visit/);
	});

	it('says nothing of failures when there were none, and writes one capture in the singular', () => {
		expect(sessionAnalysedMail({ ...visit, analysed: 4, failed: 0 }).subject).toBe('Attic listening room, Before treatment: 4 captures analysed');
		expect(sessionAnalysedMail({ ...visit, analysed: 1, failed: 0 }).subject).toBe('Attic listening room, Before treatment: 1 capture analysed');
		expect(sessionAnalysedMail({ ...visit, analysed: 0, failed: 2 }).subject).toBe('Attic listening room, Before treatment: 0 captures analysed, 2 failed');
	});
});
